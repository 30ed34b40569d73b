import { lazy, Suspense, useEffect, useMemo, useState } from 'react';
import type { Scenario } from '../core/types';
import { siteStateAt } from '../core/ephemeris';
import { parseUtcMs } from '../core/time';
import type { GlobeShading } from './globe/SiteGlobe';
import type { Draft } from './state/draft';
import { earthShadingFor } from './state/earthShading';
import { utcMinute } from './format';
import { subPointsDeg } from '../core/subpoints';

// The site globe with the Sun and Earth directions at one moment and, for the
// Moon, the Earth-visibility shading.

type V3 = [number, number, number];

// three.js is loaded on its own, so the first map does not wait for it.
const SiteGlobe = lazy(() => import('./globe/SiteGlobe').then((m) => ({ default: m.SiteGlobe })));
const D2R = Math.PI / 180;

/** Body-fixed unit vector of a direction seen at (lat, lon) with azimuth (N->E) and elevation. */
export function localToBodyFixed(latDeg: number, lonDeg: number, azDeg: number, elDeg: number): V3 {
  const la = latDeg * D2R, lo = lonDeg * D2R, az = azDeg * D2R, el = elDeg * D2R;
  const up: V3 = [Math.cos(la) * Math.cos(lo), Math.cos(la) * Math.sin(lo), Math.sin(la)];
  const east: V3 = [-Math.sin(lo), Math.cos(lo), 0];
  const north: V3 = [-Math.sin(la) * Math.cos(lo), -Math.sin(la) * Math.sin(lo), Math.cos(la)];
  const ce = Math.cos(el), e = ce * Math.sin(az), n = ce * Math.cos(az), u = Math.sin(el);
  return [e * east[0] + n * north[0] + u * up[0], e * east[1] + n * north[1] + u * up[1], e * east[2] + n * north[2] + u * up[2]];
}

/** Sun/Earth seen from the site at one track sample (the time scrubber). */
export interface SiteSample { ms: number; sunAz: number; sunEl: number; earthAz: number | null; earthEl: number | null }

export function GlobePane({ draft, scenario, onPick, atMs, sample, shadingReady = true, valueLayer = null }: {
  draft: Draft;
  scenario: Scenario | null;
  onPick: (lat: number, lon: number) => void;
  atMs?: number | null;
  sample?: SiteSample | null;
  /** false until the first plan result is in, so the shading worker does not slow the first map */
  shadingReady?: boolean;
  /** a value layer (a survey figure, core/surveyLayer.ts) drawn instead of the Earth-visibility shading; null = none */
  valueLayer?: GlobeShading | null;
}) {
  const latN = Number(draft.lat);
  const lonN = Number(draft.lon);
  const lat = Number.isFinite(latN) && Math.abs(latN) <= 90 ? latN : (scenario?.site.lat_deg ?? 0);
  const lon = Number.isFinite(lonN) ? lonN : (scenario?.site.lon_deg ?? 0);
  const body = draft.body;
  const startMs = scenario ? parseUtcMs(scenario.span.start) : null;
  const t = sample ? sample.ms : (atMs ?? startMs);

  const dirs = useMemo(() => {
    if (!scenario || t === null || scenario.site.body !== body) return { sun: null, earth: null, err: null as string | null };
    if (sample) {
      const sLat = scenario.site.lat_deg, sLon = scenario.site.lon_deg;
      return {
        sun: localToBodyFixed(sLat, sLon, sample.sunAz, sample.sunEl),
        earth: sample.earthAz !== null && sample.earthEl !== null ? localToBodyFixed(sLat, sLon, sample.earthAz, sample.earthEl) : null,
        sunElev: sample.sunEl,
        earthElev: sample.earthEl,
        err: null,
      };
    }
    try {
      const st = siteStateAt(scenario, t);
      const sLat = scenario.site.lat_deg, sLon = scenario.site.lon_deg;
      return {
        sun: localToBodyFixed(sLat, sLon, st.sun_az_deg, st.sun_elev_deg),
        earth: st.earth_az_deg !== null && st.earth_elev_deg !== null ? localToBodyFixed(sLat, sLon, st.earth_az_deg, st.earth_elev_deg) : null,
        sunElev: st.sun_elev_deg,
        earthElev: st.earth_elev_deg,
        err: null,
      };
    } catch (e) {
      return { sun: null, earth: null, err: e instanceof Error ? e.message : String(e) };
    }
  }, [scenario, t, body, sample]);

  const [shading, setShading] = useState<GlobeShading | null>(null);
  const [shadeMsg, setShadeMsg] = useState<string | null>(null);
  useEffect(() => {
    if (body !== 'moon' || startMs === null) { setShading(null); return; }
    if (!shadingReady) return;
    let live = true;
    setShadeMsg('Computing Earth-visibility shading…');
    earthShadingFor(startMs).then(
      (s) => { if (live) { setShading(s); setShadeMsg(null); } },
      (e) => { if (live) setShadeMsg(`Earth-visibility shading unavailable: ${e instanceof Error ? e.message : String(e)}`); },
    );
    return () => { live = false; };
  }, [body, shadingReady, startMs === null ? null : new Date(startMs).getUTCFullYear()]); // eslint-disable-line react-hooks/exhaustive-deps

  // The Moon's sub-Earth point at the moment shown (it wanders about 0, 0 with the libration).
  const subEarth = useMemo((): [number, number] | null => {
    if (body !== 'moon' || t === null) return null;
    try {
      return subPointsDeg('moon', t).earth;
    } catch {
      return null;
    }
  }, [body, t]);
  // The Earth's direction: always on the Moon; on Mars where the Earth constraint is on (it matters there).
  const showEarth = body === 'moon' || (body === 'mars' && scenario !== null && scenario.site.body === 'mars' && scenario.constraints.earth_max_elev_deg !== null);
  const d = dirs as { sun: V3 | null; earth: V3 | null; sunElev?: number; earthElev?: number | null; err: string | null };
  return (
    <figure className="globe-pane">
      <div className="globe-box">
        <Suspense fallback={<p className="muted">Loading the globe…</p>}>
          <SiteGlobe body={body} lat_deg={lat} lon_deg={lon} onPick={onPick} sunDir={d.sun} earthDir={showEarth ? d.earth : null}
            shading={valueLayer ?? (body === 'moon' ? shading : null)} subEarth={subEarth} />
        </Suspense>
      </div>
      <figcaption>
        <span>Drag to turn, click to move the site.</span>
        {t !== null && d.sun && (
          <span>
            {' '}At {utcMinute(t)}: Sun {d.sunElev !== undefined ? `${d.sunElev.toFixed(1)}°` : ''}
            {showEarth && d.earth && d.earthElev !== null && d.earthElev !== undefined ? `, Earth ${d.earthElev.toFixed(1)}°` : ''} elevation at the site.
            {subEarth ? ` Sub-Earth point ${Math.abs(subEarth[0]).toFixed(1)}° ${subEarth[0] < 0 ? 'S' : 'N'}, ${Math.abs(subEarth[1]).toFixed(1)}° ${subEarth[1] < 0 ? 'W' : 'E'}.` : ''}
          </span>
        )}
        {d.err && <span className="error"> Sun/Earth directions unavailable: {d.err}</span>}
        {shadeMsg && <span className="muted"> {shadeMsg}</span>}
      </figcaption>
    </figure>
  );
}

// Exposure and covered sky against an independent computation with healpy
// (HEALPix reference implementation, Górski et al. 2005; Debian python3-healpy)
// run through /usr/bin/python3 on the same usable path. Skipped when healpy (or
// scipy, for the Airy case) is missing, except under CI=true where the file fails.
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { coveredMask, exposureMap, hitMap, hitNsideFor, relativeL1 } from '../../src/core/coverage';
import { blockMask, gaussianProfile, smallCircleTrack } from '../unit/coverage-fixtures';
import { makeBeam } from '../../src/core/beam';
import { runPlan } from '../../src/engine/runPlan';
import type { Scenario } from '../../src/core/types';

import { PY, requirePython } from './pythonRef';
const script = fileURLToPath(new URL('./coverage-healpy.py', import.meta.url));
const hasHealpy = requirePython(['healpy', 'numpy'], 'the exposure check against healpy');

describe.skipIf(!hasHealpy)('coverage vs healpy', () => {
  // Path: a zenith drifting 2 deg/h along dec +25 with a 2-deg wobble over
  // 6 days, 45-min samples (1.5 deg per step, longer than the narrower beam's
  // FWHM/2), usable in blocks. Cut into 12 midpoint pieces per sample here for
  // the exposure, and each usable sample's whole arc for the covered sky,
  // written out independently of src/core/coverage.ts.
  const track = smallCircleTrack({ decDeg: 25, rateDegPerH: 2, stepMin: 45, spanH: 24 * 6, wobbleDeg: 2, wobblePeriodH: 50 });
  const usable = blockMask(track.n, 9, 4);
  const points: number[][] = [];
  const arcs: number[][] = [];
  for (let i = 0; i < track.n; i++) {
    if (!usable[i]) continue;
    const a = [track.zx[i], track.zy[i], track.zz[i]];
    const nxt = i + 1 < track.n ? [track.zx[i + 1], track.zy[i + 1], track.zz[i + 1]] : a.map((v, k) => 2 * v - [track.zx[i - 1], track.zy[i - 1], track.zz[i - 1]][k]);
    arcs.push([...a, ...nxt]);
    for (let j = 0; j < 12; j++) {
      const t = (j + 0.5) / 12;
      points.push([...a.map((v, k) => v + (nxt[k] - v) * t), track.weight_h[i] / 12]);
    }
  }

  for (const [fwhmDeg, nside] of [[3, 64], [8, 32]] as const) {
    it(`FWHM ${fwhmDeg} deg at nside ${nside}: exposure within 0.5% (relative L1), max within 0.5%, covered fraction within 0.1%`, () => {
      const beam = gaussianProfile(fwhmDeg);
      const out = spawnSync(PY, [script], {
        input: JSON.stringify({ nside, fwhm_rad: beam.fwhmRad, cutoff_rad: beam.cutoffRad, points, arcs }),
        encoding: 'utf8',
        maxBuffer: 1 << 28,
      });
      expect(out.status, out.stderr).toBe(0);
      const ref = JSON.parse(out.stdout) as { exposure: number[]; covered_fraction: number };
      const hit = hitMap(track, usable, { nside: hitNsideFor(beam.fwhmRad) });
      const ours = exposureMap(hit, beam, nside);
      expect(relativeL1(ours, ref.exposure)).toBeLessThan(0.005);
      const maxRef = Math.max(...ref.exposure);
      expect(Math.abs(Math.max(...ours) / maxRef - 1)).toBeLessThan(0.005);
      const mask = coveredMask(hit, beam.fwhmRad / 2, nside);
      let c = 0;
      for (const v of mask) c += v;
      // the same path and the same distance definition on both sides: equal but for
      // a pixel centre at the edge to rounding (measured: equal)
      expect(Math.abs(c / mask.length / ref.covered_fraction - 1), `covered ${c / mask.length} vs ${ref.covered_fraction}`).toBeLessThan(0.001);
    });
  }
});

const hasScipy = hasHealpy && requirePython(['scipy.special'], 'the Airy exposure check against healpy and scipy');

describe.skipIf(!hasHealpy)('a whole plan vs healpy', () => {
  // An invented lunar site over 25 days (about one lunar day and night), the
  // plan's own track and usable flags, beams from beam.ts; healpy sums the beam
  // (cut where B < 1e-3, as ARCHITECTURE.md section 2 allows) around 8 pieces
  // of every usable sample's path and finds the pixels within FWHM/2 of its arcs.
  const scenario: Scenario = {
    format: 'swathe.scenario/1',
    name: 'healpy check (invented site)',
    site: { body: 'moon', lat_deg: 12.5, lon_deg: -140 },
    span: { start: '2032-05-01T00:00:00Z', end: '2032-05-26T00:00:00Z', step_min: 40 },
    telescope: { aperture_m: 350, frequencies_mhz: [9, 27], beam: { model: 'gaussian', fwhm_factor: 1.15 } },
    constraints: { sun_max_elev_deg: 0, earth_max_elev_deg: 0, horizon_mask: null },
    map: { nside: 64, galactic_band_deg: 10, galactic_center_radius_deg: 20 },
  };
  for (const model of ['gaussian', 'airy'] as const) {
    it.skipIf(model === 'airy' && !hasScipy)(`${model} beams: each exposure map within 1% (relative L1), max within 1%, covered fraction within 0.1%`, async () => {
      const s = { ...scenario, telescope: { ...scenario.telescope, beam: { model, fwhm_factor: 1.15 } } };
      const r = await runPlan(s);
      const t = r.track;
      const pts: number[][] = [];
      const arcs: number[][] = [];
      for (let i = 0; i < t.n; i++) {
        if (!r.usable[i]) continue;
        const a = [t.zx[i], t.zy[i], t.zz[i]];
        const e = i + 1 < t.n ? [t.zx[i + 1], t.zy[i + 1], t.zz[i + 1]] : a.map((v, k) => v + (v - [t.zx[i - 1], t.zy[i - 1], t.zz[i - 1]][k]) * (t.weight_h[i] / (t.step_min / 60)));
        arcs.push([...a, ...e]);
        for (let j = 0; j < 8; j++) pts.push([...a.map((v, k) => v + (e[k] - v) * ((j + 0.5) / 8)), t.weight_h[i] / 8]);
      }
      expect(pts.length).toBeGreaterThan(1000);
      for (let k = 0; k < 2; k++) {
        const b = makeBeam(s.telescope.frequencies_mhz[k], s.telescope.aperture_m!, s.telescope.beam);
        const out = spawnSync(PY, [script], {
          input: JSON.stringify({ nside: 64, fwhm_rad: b.fwhmRad, cutoff_rad: b.cutoffRad, model, lambda_over_d: b.wavelengthM / s.telescope.aperture_m!, points: pts, arcs }),
          encoding: 'utf8',
          maxBuffer: 1 << 28,
        });
        expect(out.status, out.stderr).toBe(0);
        const ref = JSON.parse(out.stdout) as { exposure: number[]; covered_fraction: number };
        expect(relativeL1(r.maps[k], ref.exposure)).toBeLessThan(0.01);
        const f = r.summary.frequencies[k];
        expect(Math.abs(f.exposure_max_h / Math.max(...ref.exposure) - 1)).toBeLessThan(0.01);
        // the same path, the same distance definition: equal but for a centre at the edge to rounding (measured: equal)
        expect(Math.abs(f.sky_fraction_covered / ref.covered_fraction - 1), `covered ${f.sky_fraction_covered} vs ${ref.covered_fraction}`).toBeLessThan(0.001);
      }
    });
  }
});

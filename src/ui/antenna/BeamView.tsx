import { useMemo } from 'react';
import type { Scenario } from '../../core/types';
import { principalCuts, type PlaneCut } from '../../core/antenna/cuts';
import { outlineColour } from '../skymap/coverageOutline';
import { sig } from '../format';
import { useWidth } from '../useWidth';

// The beam view: cuts of the main beam's power pattern in its two principal
// planes at every frequency, in dB (0 to -30) over -90..90 degrees from the
// boresight, with the half-power level marked. Values come from the antenna
// API (core/antenna/cuts.ts); this file only draws them, as SVG.

const FLOOR_DB = -30;
const HALF_DB = 10 * Math.log10(0.5);

/** A cut's half-power width; 360 is the API's word for a cut that never falls to half power. */
const widthText = (w: number) => (w >= 360 ? 'none (never below half power)' : `${sig(w, 3)}°`);

/** Short plane names for the legend. */
function planeShort(s: Scenario, cuts: PlaneCut[]): [string, string] {
  const m = s.telescope.beam.model;
  if (m === 'dipole') return ['E-plane', 'H-plane'];
  if (m === 'elliptical_gaussian') return ['long side', 'short side'];
  const az = (c: PlaneCut) => `azimuth ${sig(((c.azimuthDeg % 360) + 360) % 360, 4)}°`;
  return [az(cuts[0]), az(cuts[1])];
}

function planeNames(s: Scenario, cuts: PlaneCut[]): [string, string] {
  const b = s.telescope.beam;
  const az = (c: PlaneCut) => `${sig(((c.azimuthDeg % 360) + 360) % 360, 4)}°`;
  const [a, c] = cuts;
  if (b.model === 'dipole') return [`E-plane: along the wire (azimuth ${az(a)})`, `H-plane: across the wire (azimuth ${az(c)})`];
  if (b.model === 'elliptical_gaussian') return [`Along the long side (azimuth ${az(a)})`, `Along the short side (azimuth ${az(c)})`];
  if (b.model === 'pattern') return [`Table plane at azimuth ${az(a)}`, `Table plane at azimuth ${az(c)}`];
  return [`Plane at azimuth ${az(a)}`, `Plane at azimuth ${az(c)} (the same: a circular beam)`];
}

function Panel({ title, cuts, freqs, selected, width, testId }: {
  title: string;
  cuts: PlaneCut[];
  freqs: number[];
  selected: number;
  width: number;
  testId: string;
}) {
  const W = Math.max(240, width), H = 210;
  const m = { l: 40, r: 62, t: 8, b: 34 };
  const pw = W - m.l - m.r, ph = H - m.t - m.b;
  const x = (deg: number) => m.l + ((deg + 90) / 180) * pw;
  const y = (db: number) => m.t + (Math.max(FLOOR_DB, Math.min(0, db)) / FLOOR_DB) * ph;
  const clipId = `${testId}-clip`;
  return (
    <figure className="beam-panel" data-testid={testId}>
      <figcaption>{title}</figcaption>
      <svg width={W} height={H} viewBox={`0 0 ${W} ${H}`} role="img"
        aria-label={`${title}: power in dB against the angle from the boresight, ${freqs.map((f, i) => `${sig(f, 6)} MHz half-power width ${widthText(cuts[i].fwhmDeg)}`).join(', ')}`}>
        <defs><clipPath id={clipId}><rect x={m.l} y={m.t} width={pw} height={ph} /></clipPath></defs>
        {[0, -10, -20, -30].map((d) => (
          <g key={d}>
            <line x1={m.l} x2={m.l + pw} y1={y(d)} y2={y(d)} className="grid" />
            <text x={m.l - 5} y={y(d) + 4} className="tick" textAnchor="end">{d === 0 ? '0' : `−${-d}`}</text>
          </g>
        ))}
        {[-90, -60, -30, 0, 30, 60, 90].map((a) => (
          <g key={a}>
            <line x1={x(a)} x2={x(a)} y1={m.t} y2={m.t + ph} className="grid" />
            <text x={x(a)} y={m.t + ph + 14} className="tick" textAnchor="middle">{a < 0 ? `−${-a}` : a}</text>
          </g>
        ))}
        <text x={m.l + pw / 2} y={H - 3} className="axis-label" textAnchor="middle">Angle from the boresight (°)</text>
        <text x={11} y={m.t + ph / 2} className="axis-label" textAnchor="middle" transform={`rotate(-90 11 ${m.t + ph / 2})`}>dB</text>
        <line x1={m.l} x2={m.l + pw} y1={y(HALF_DB)} y2={y(HALF_DB)} className="half-power" data-testid={`${testId}-half`} />
        <text x={m.l + pw + 4} y={y(HALF_DB) + 4} className="half-label">−3 dB</text>
        <text x={m.l + pw + 4} y={y(HALF_DB) + 16} className="half-label sub">half power</text>
        <g clipPath={`url(#${clipId})`}>
          {cuts.map((c, i) => {
            let d = '';
            for (let k = 0; k < c.angleDeg.length; k++) d += `${k ? 'L' : 'M'}${x(c.angleDeg[k]).toFixed(1)},${y(Number.isFinite(c.db[k]) ? c.db[k] : FLOOR_DB).toFixed(1)}`;
            return <path key={i} d={d} fill="none" stroke={outlineColour(i)} strokeWidth={i === selected ? 2.6 : 1.5} data-mhz={freqs[i]} />;
          })}
        </g>
        <rect x={m.l} y={m.t} width={pw} height={ph} className="frame" />
      </svg>
    </figure>
  );
}

export function BeamView({ scenario, selected }: { scenario: Scenario; selected: number }) {
  const freqs = scenario.telescope.frequencies_mhz;
  const cuts = useMemo(() => freqs.map((f) => principalCuts(scenario, f)), [scenario, freqs]);
  const [ref, width] = useWidth<HTMLDivElement>(700);
  const names = planeNames(scenario, cuts[0]);
  const short = planeShort(scenario, cuts[0]);
  const side = width >= 620;
  const pw = side ? Math.floor((width - 16) / 2) : width;
  return (
    <section className="beam-view" aria-labelledby="beam-head" data-testid="beam-view">
      <h3 id="beam-head">Beam: pattern cuts in the two principal planes</h3>
      <div className="beam-panels" ref={ref}>
        <Panel title={names[0]} cuts={cuts.map((c) => c[0])} freqs={freqs} selected={selected} width={pw} testId="beam-cut-1" />
        <Panel title={names[1]} cuts={cuts.map((c) => c[1])} freqs={freqs} selected={selected} width={pw} testId="beam-cut-2" />
      </div>
      <ul className="beam-legend">
        {freqs.map((f, i) => (
          <li key={i}>
            <span className="swatch" style={{ background: outlineColour(i) }} aria-hidden="true" />
            {sig(f, 6)} MHz: half-power width {widthText(cuts[i][0].fwhmDeg)} ({short[0]}), {widthText(cuts[i][1].fwhmDeg)} ({short[1]})
          </li>
        ))}
      </ul>
      <p className="table-note">
        Power pattern of the main beam in free space (no horizon), normalised to its maximum, in the antenna frame
        (angle from the boresight; the planes' azimuths from y′ through x′); the dashed line is the half-power level (−3 dB).
        Below −30 dB the curves rest on the bottom edge.
        Extra feeds have the same pattern about their own boresights. Planning estimates from the stated models.
      </p>
    </section>
  );
}

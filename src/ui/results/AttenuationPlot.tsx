import { useMemo } from 'react';
import type { PlanResult } from '../../core/types';
import { attenuatedBodies, bodyRimLossDb } from '../../core/shielding/usableByFrequency';
import { prepareMask } from '../../core/horizon';
import { prepareRimDistance } from '../../core/shielding/rim';
import { sig, utcMinute } from '../format';
import { useWidth } from '../useWidth';

// Knife-edge attenuation over the rim (ITU-R P.526, single knife edge) against
// frequency for the Sun and the Earth at one moment (the time scrubber's, or
// the span's start), with the required attenuation drawn as a line: a body is
// shielded at the frequencies where its curve is above the line.

const H = 190;
const PAD = { l: 46, r: 12, t: 12, b: 36 };
const COLOURS = { sun: 'rgb(214, 150, 0)', earth: 'rgb(40, 110, 200)' } as const;
const NAMES = { sun: 'Sun', earth: 'Earth' } as const;
const N = 120;

export function AttenuationPlot({ result, index }: { result: PlanResult; index: number | null }) {
  const [ref, width] = useWidth<HTMLDivElement>(600);
  const s = result.scenario;
  const diff = s.constraints.diffraction!;
  const t = result.track;
  const freqs = s.telescope.frequencies_mhz;
  const fLo = Math.min(...freqs) / 4, fHi = Math.max(...freqs) * 4;
  const bodies = attenuatedBodies(t, s);
  const prepared = useMemo(() => ({ mask: prepareMask(s.constraints.horizon_mask), rim: prepareRimDistance(s.constraints.horizon_mask, diff.rim_distance_m) }), [s, diff]);
  // without the scrubber: the first moment a body is behind the rim (where the plot has something to say)
  const firstBehind = useMemo(() => {
    for (let k = 0; k < t.n; k++) {
      for (const b of bodies) {
        const e = (b === 'sun' ? t.sun_elev_deg : t.earth_elev_deg!)[k];
        const a = (b === 'sun' ? t.sun_az_deg : t.earth_az_deg!)[k];
        const margin = (b === 'sun' ? s.constraints.sun_max_elev_deg : s.constraints.earth_max_elev_deg) ?? 0;
        if (e >= 0 && e < prepared.mask.at(a) + margin) return k;
      }
    }
    return 0;
  }, [t, s, bodies.join(','), prepared]); // eslint-disable-line react-hooks/exhaustive-deps
  const i = Math.max(0, Math.min(t.n - 1, index ?? firstBehind));
  const curves = useMemo(() => bodies.map((b) => {
    const elev = (b === 'sun' ? t.sun_elev_deg : t.earth_elev_deg!)[i];
    const pts: [number, number][] = [];
    for (let k = 0; k <= N; k++) {
      const f = fLo * (fHi / fLo) ** (k / N);
      pts.push([f, bodyRimLossDb(t, s, b, i, f, prepared) ?? 0]);
    }
    const at = freqs.map((f) => bodyRimLossDb(t, s, b, i, f, prepared) ?? 0);
    const mask = prepared.mask.at((b === 'sun' ? t.sun_az_deg : t.earth_az_deg!)[i]);
    const margin = (b === 'sun' ? s.constraints.sun_max_elev_deg : s.constraints.earth_max_elev_deg) ?? 0;
    const state = elev < 0 ? 'below its horizon: shielded at every frequency' : elev >= mask + margin ? 'above the skyline: not shielded' : 'behind the rim';
    return { b, pts, at, elev, state };
  }), [bodies.join(','), i, prepared, fLo, fHi]); // eslint-disable-line react-hooks/exhaustive-deps
  const need = diff.min_attenuation_db;
  const yMax = Math.max(need * 1.6, 10, ...curves.flatMap((c) => c.pts.map((p) => Math.min(p[1], 80)))) ;
  const yTop = Math.ceil(yMax / 10) * 10;
  const pw = Math.max(60, width - PAD.l - PAD.r), ph = H - PAD.t - PAD.b;
  const x = (f: number) => PAD.l + (Math.log(f / fLo) / Math.log(fHi / fLo)) * pw;
  const y = (db: number) => PAD.t + (1 - Math.min(db, yTop) / yTop) * ph;
  const decades: number[] = [];
  for (let e = Math.floor(Math.log10(fLo)); e <= Math.ceil(Math.log10(fHi)); e++) for (const m of [1, 2, 5]) { const v = m * 10 ** e; if (v >= fLo && v <= fHi) decades.push(v); }
  const yTicks: number[] = [];
  for (let v = 0; v <= yTop; v += yTop > 60 ? 20 : 10) yTicks.push(v);
  const ms = t.t0_ms + i * t.step_min * 60_000;
  return (
    <figure className="atten-plot" data-testid="attenuation-plot" ref={ref}>
      <figcaption>
        <span className="fig-title">Attenuation over the rim at {utcMinute(ms)}</span>{' '}
        <span className="muted">{index === null ? '(the first moment a body is behind the rim; turn on the time scrubber to choose another)' : '(the time scrubber\'s moment)'}</span>
      </figcaption>
      <svg width={width} height={H} role="img" aria-label={`Knife-edge attenuation in dB against frequency for ${curves.map((c) => NAMES[c.b]).join(' and ')}, with the required ${need} dB as a line`}>
        {yTicks.map((v) => (
          <g key={v}>
            <line x1={PAD.l} x2={PAD.l + pw} y1={y(v)} y2={y(v)} stroke="#e3e6ea" />
            <text x={PAD.l - 4} y={y(v) + 4} textAnchor="end" fontSize="11" fill="#555">{v}</text>
          </g>
        ))}
        {decades.map((f) => (
          <g key={f}>
            <line x1={x(f)} x2={x(f)} y1={PAD.t} y2={PAD.t + ph} stroke="#eef0f2" />
            <text x={x(f)} y={PAD.t + ph + 14} textAnchor="middle" fontSize="11" fill="#555">{sig(f, 3)}</text>
          </g>
        ))}
        <text x={PAD.l + pw / 2} y={H - 4} textAnchor="middle" fontSize="11" fill="#333">frequency (MHz, logarithmic)</text>
        <text x={12} y={PAD.t + ph / 2} textAnchor="middle" fontSize="11" fill="#333" transform={`rotate(-90 12 ${PAD.t + ph / 2})`}>dB</text>
        <line x1={PAD.l} x2={PAD.l + pw} y1={y(need)} y2={y(need)} stroke="#b3261e" strokeDasharray="6 4" strokeWidth="1.5" />
        <text x={PAD.l + pw - 2} y={y(need) - 4} textAnchor="end" fontSize="11" fill="#b3261e">required {need} dB</text>
        {curves.map((c) => c.elev >= 0 && (
          <g key={c.b}>
            <polyline fill="none" stroke={COLOURS[c.b]} strokeWidth="2" points={c.pts.map(([f, db]) => `${x(f).toFixed(1)},${y(db).toFixed(1)}`).join(' ')} />
            {freqs.map((f, k) => <circle key={k} cx={x(f)} cy={y(c.at[k])} r="3" fill={COLOURS[c.b]} />)}
          </g>
        ))}
        <rect x={PAD.l} y={PAD.t} width={pw} height={ph} fill="none" stroke="#999" />
      </svg>
      <ul className="atten-legend">
        {curves.map((c) => (
          <li key={c.b} data-testid={`atten-${c.b}`}>
            <span className="key key-line" style={{ background: COLOURS[c.b] }} /> {NAMES[c.b]} at {sig(c.elev, 3)}° elevation, {c.state}
            {c.elev >= 0 && <>: {freqs.map((f, k) => `${sig(f, 4)} MHz ${c.at[k].toFixed(1)} dB`).join(', ')}</>}
          </li>
        ))}
        {curves.length === 0 && <li>No constrained body (Sun or Earth) to attenuate.</li>}
      </ul>
    </figure>
  );
}

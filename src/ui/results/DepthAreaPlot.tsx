import { useMemo } from 'react';
import type { PlanResult } from '../../core/types';
import { depthArea } from '../../core/sky/depthArea';
import { kelvin, sig } from '../format';
import { outlineColour } from '../skymap/coverageOutline';

// Depth-area curves (issue 12): the sky area whose noise is at or below each
// level, per frequency, log-log, from the same function that writes
// depth_area.csv (so the plot and the file agree point for point).

const W = 640, H = 240, L = 60, R = 14, T = 12, B = 36;

function decades(lo: number, hi: number): number[] {
  const out: number[] = [];
  for (let e = Math.floor(Math.log10(lo)); e <= Math.ceil(Math.log10(hi)); e++) out.push(10 ** e);
  return out;
}

export function DepthAreaPlot({ result }: { result: PlanResult }) {
  const d = useMemo(() => depthArea(result.noise_maps ?? []), [result.noise_maps]);
  const mhz = result.scenario.telescope.frequencies_mhz;
  if (d.levelsK.length < 2) return null;
  const x0 = d.levelsK[0], x1 = d.levelsK[d.levelsK.length - 1];
  let a0 = Infinity, a1 = 0;
  for (const a of d.areaDeg2) for (const v of a) if (v > 0) { if (v < a0) a0 = v; if (v > a1) a1 = v; }
  if (!(a0 < a1)) return null;
  const lx0 = Math.log10(x0), lx1 = Math.log10(x1), ly0 = Math.log10(a0), ly1 = Math.log10(a1);
  const x = (v: number) => L + ((Math.log10(v) - lx0) / (lx1 - lx0 || 1)) * (W - L - R);
  const y = (v: number) => T + ((ly1 - Math.log10(v)) / (ly1 - ly0 || 1)) * (H - T - B);
  const xt = decades(x0, x1).filter((v) => v >= x0 * 0.999 && v <= x1 * 1.001);
  const yt = decades(a0, a1).filter((v) => v >= a0 * 0.999 && v <= a1 * 1.001);
  return (
    <figure className="ra-fold depth-area" data-testid="depth-area" data-levels={d.levelsK.length}>
      <figcaption>
        <span className="fig-title">Depth–area: sky area with noise at or below each level (log–log)</span>
        <span className="legend-items">
          {mhz.map((f, k) => <span className="li" key={k}><span className="key" style={{ background: outlineColour(k) }} /> {sig(f, 6)} MHz</span>)}
        </span>
        <span className="muted">as in depth_area.csv; noise from T_sys(t) = T_ant(t) + receiver</span>
      </figcaption>
      <svg viewBox={`0 0 ${W} ${H}`} width="100%" role="img"
        aria-label={`Depth-area curves, log-log: sky area in square degrees against noise level from ${kelvin(x0)} to ${kelvin(x1)}, one curve per frequency`}>
        {yt.map((v) => (
          <g key={`y${v}`}>
            <line x1={L} x2={W - R} y1={y(v)} y2={y(v)} stroke="#e3e6ea" />
            <text x={L - 6} y={y(v)} fontSize="11" textAnchor="end" dominantBaseline="middle" fill="#475160">{v >= 1 ? v.toLocaleString('en-US') : String(v)}</text>
          </g>
        ))}
        {xt.map((v) => (
          <g key={`x${v}`}>
            <line x1={x(v)} x2={x(v)} y1={T} y2={H - B} stroke="#eef0f3" />
            <text x={x(v)} y={H - B + 14} fontSize="11" textAnchor="middle" fill="#475160">{kelvin(v)}</text>
          </g>
        ))}
        <text x={(L + W - R) / 2} y={H - 4} fontSize="11" textAnchor="middle" fill="#475160">noise level σ_T</text>
        <text x={12} y={(T + H - B) / 2} fontSize="11" textAnchor="middle" fill="#475160" transform={`rotate(-90 12 ${(T + H - B) / 2})`}>area (deg²)</text>
        {d.areaDeg2.map((a, k) => {
          const pts: string[] = [];
          a.forEach((v, j) => { if (v > 0) pts.push(`${x(d.levelsK[j]).toFixed(1)},${y(v).toFixed(1)}`); });
          return <polyline key={k} points={pts.join(' ')} fill="none" stroke={outlineColour(k)} strokeWidth={2} data-testid={`depth-area-line-${k}`} data-points={pts.length} />;
        })}
      </svg>
    </figure>
  );
}

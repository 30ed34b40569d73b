import type { SkyFrame, SkyScale } from './skymap/SkyMap';
import { sig } from './format';

// How the computed maps are shown: none of these recompute anything.

export function ViewControls(p: {
  freqs: number[];
  freqIndex: number; onFreq: (i: number) => void;
  frame: SkyFrame; onFrame: (f: SkyFrame) => void;
  scale: SkyScale; onScale: (s: SkyScale) => void;
  /** the sky-temperature view is always logarithmic: the select is shown fixed */
  scaleFixedLog?: boolean;
  flip: boolean; onFlip: (v: boolean) => void;
  compare: boolean; onCompare: (v: boolean) => void;
}) {
  return (
    <div className="view-controls">
      <div className="seg" role="radiogroup" aria-label="Frequency shown">
        {p.freqs.map((f, i) => (
          <label key={i} className={i === p.freqIndex ? 'on' : undefined}>
            <input type="radio" name="freq" checked={i === p.freqIndex} onChange={() => p.onFreq(i)} disabled={p.compare} />
            {sig(f, 6)} MHz
          </label>
        ))}
      </div>
      <span className="ctl">
      <label htmlFor="view-frame">Frame</label>
      <select id="view-frame" value={p.frame} onChange={(e) => p.onFrame(e.target.value as SkyFrame)}>
        <option value="equatorial">Equatorial (RA, Dec)</option>
        <option value="galactic">Galactic (l, b)</option>
        <option value="ecliptic">Ecliptic (λ, β)</option>
      </select>
      </span>
      <span className="ctl">
      <label htmlFor="view-scale">Colour scale</label>
      <select id="view-scale" value={p.scaleFixedLog ? 'log' : p.scale} disabled={p.scaleFixedLog}
        title={p.scaleFixedLog ? 'The sky temperature is always shown on a logarithmic scale (it spans a factor of ten or more)' : undefined}
        onChange={(e) => p.onScale(e.target.value as SkyScale)}>
        <option value="linear">Linear</option>
        <option value="log">Logarithmic</option>
      </select>
      </span>
      <label className="check" title="Astronomical convention is longitude increasing to the left">
        <input type="checkbox" checked={p.flip} onChange={(e) => p.onFlip(e.target.checked)} /> Longitude increasing to the right
      </label>
      <label className="check">
        <input type="checkbox" checked={p.compare} onChange={(e) => p.onCompare(e.target.checked)} /> Compare all frequencies
      </label>
    </div>
  );
}

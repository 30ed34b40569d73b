import { useEffect, useRef, useState } from 'react';
import type { PlanResult } from '../../core/types';
import { utcMinute, fixed } from '../format';

// A moment in the span: slider and play. The beam position on the sky map, the
// Sun/Earth arrows on the globe and the timeline cursor follow the sample index.

const SPEEDS = [
  { label: 'span in 10 s', seconds: 10 },
  { label: 'span in 30 s', seconds: 30 },
  { label: 'span in 2 min', seconds: 120 },
];

export function TimeScrubber({ result, index, onIndex, crossings }: {
  result: PlanResult;
  index: number;
  onIndex: (i: number) => void;
  crossings: number[];
}) {
  const t = result.track;
  const [playing, setPlaying] = useState(false);
  const [speed, setSpeed] = useState(1);
  const idx = useRef(index);
  idx.current = index;

  useEffect(() => {
    if (!playing) return;
    let raf = 0;
    let last = performance.now();
    let acc = idx.current;
    const perMs = t.n / (SPEEDS[speed].seconds * 1000);
    const tick = (now: number) => {
      acc += (now - last) * perMs;
      last = now;
      if (acc >= t.n - 1) { onIndex(t.n - 1); setPlaying(false); return; }
      onIndex(Math.floor(acc));
      raf = requestAnimationFrame(tick);
    };
    raf = requestAnimationFrame(tick);
    return () => cancelAnimationFrame(raf);
  }, [playing, speed, t.n, onIndex]);

  const ms = t.t0_ms + index * t.step_min * 60_000;
  const usable = result.usable[index] === 1;
  const nextCross = crossings.find((c) => c > ms + 1);
  return (
    <section className="scrubber" aria-label="Scrubbing through the span" data-testid="scrubber">
      <div className="scrub-row">
        <button type="button" onClick={() => {
          if (!playing && index >= t.n - 1) onIndex(0);
          setPlaying((p) => !p);
        }} aria-pressed={playing}>{playing ? 'Pause' : 'Play'}</button>
        <label className="sr-only" htmlFor="scrub-range">Time in the span</label>
        <input id="scrub-range" type="range" min={0} max={t.n - 1} step={1} value={index}
          aria-valuetext={utcMinute(ms)}
          onChange={(e) => { setPlaying(false); onIndex(Number(e.target.value)); }} />
        <label className="ctl">
          <span className="sr-only">Play speed</span>
          <select value={speed} onChange={(e) => setSpeed(Number(e.target.value))} aria-label="Play speed">
            {SPEEDS.map((s, i) => <option key={i} value={i}>{s.label}</option>)}
          </select>
        </label>
      </div>
      <div className="scrub-info" aria-live="off">
        <strong data-testid="scrub-time">{utcMinute(ms)}</strong>
        <span className={usable ? 'usable-yes' : 'usable-no'} data-testid="scrub-usable">{usable ? 'usable' : 'not usable'}</span>
        <span>zenith RA {fixed(t.ra_deg[index], 2)}°, Dec {fixed(t.dec_deg[index], 2)}° · l {fixed(t.l_deg[index], 2)}°, b {fixed(t.b_deg[index], 2)}°</span>
        <span>Sun {fixed(t.sun_elev_deg[index], 1)}°{t.earth_elev_deg ? `, Earth ${fixed(t.earth_elev_deg[index], 1)}°` : ''} elevation</span>
        <span className="muted">
          {crossings.length} galactic-centre passage{crossings.length === 1 ? '' : 's'} (▼ on the timeline)
          {nextCross !== undefined && (
            <> · <button type="button" className="linklike" onClick={() => onIndex(Math.round((nextCross - t.t0_ms) / (t.step_min * 60_000)))}>next: {utcMinute(nextCross)}</button></>
          )}
        </span>
      </div>
    </section>
  );
}

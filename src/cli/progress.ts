import type { CliIo } from './io';

// Progress on stderr for long runs: only when stderr is a terminal or with
// --progress, and only once a run has taken more than half a second, so
// short runs and test output stay clean. On a terminal one line is redrawn;
// elsewhere a line is printed per stage change or every 2 seconds.

/**
 * `timeLeft`: for a run that is one stage from 0 to 1 (the survey), append the
 * time left measured from the rate so far, once 5% and a second have passed.
 */
export function progressReporter(io: CliIo, enabled: boolean, now: () => number = Date.now, opts: { timeLeft?: boolean } = {}) {
  const t0 = now();
  let last = -Infinity;
  let lastStage = '';
  let drawn = false;
  const report = (stage: string, fraction: number): void => {
    if (!enabled) return;
    const t = now();
    if (t - t0 < 500) return;
    const f = Math.max(0, Math.min(1, fraction));
    const left = opts.timeLeft && f >= 0.05 && f < 1 && t - t0 >= 1000 ? `, about ${Math.max(1, Math.round(((t - t0) * (1 - f)) / f / 1000))} s left` : '';
    const pct = `${Math.floor(f * 100)}%`.padStart(4) + left;
    if (io.errIsTTY) {
      if (t - last < 100 && stage === lastStage) return;
      io.err(`\r${stage.slice(0, 40).padEnd(40)} ${pct}`);
      drawn = true;
    } else {
      if (stage === lastStage && t - last < 2000) return;
      io.err(`progress: ${stage} ${pct.trim()}\n`);
    }
    last = t;
    lastStage = stage;
  };
  const done = (): void => {
    if (drawn) io.err('\n');
    drawn = false;
  };
  return { report, done };
}

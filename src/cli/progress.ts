import type { CliIo } from './io';

// Progress on stderr for long runs: only when stderr is a terminal or with
// --progress, and only once a run has taken more than half a second, so
// short runs and test output stay clean. On a terminal one line is redrawn;
// elsewhere a line is printed per stage change or every 2 seconds.

export function progressReporter(io: CliIo, enabled: boolean, now: () => number = Date.now) {
  const t0 = now();
  let last = -Infinity;
  let lastStage = '';
  let drawn = false;
  const report = (stage: string, fraction: number): void => {
    if (!enabled) return;
    const t = now();
    if (t - t0 < 500) return;
    const pct = `${Math.floor(Math.max(0, Math.min(1, fraction)) * 100)}%`.padStart(4);
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

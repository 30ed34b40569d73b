// Measures what the run estimate's first-run warm-up term (WARM_UP_FIRST_RUN_S
// in src/core/limits.ts) stands for, in Debian's Chromium against the
// production build (not a test: nothing is asserted). In each fresh page:
//   run 1: the demo, which runs on opening: a new worker, its code not yet
//          compiled, the galaxy sky maps to build;
//   run 2: Compute again, same scenario, same worker (warm, maps built);
//   run 3: the demo's frequencies times 10^(2/20) (the galaxy model's node
//          spacing twice over, so every map is new), same worker: warm, with
//          as many maps to build as run 1.
// Each run's wall time from the request to the result is the run bar's
// data-last-ms. The estimate without the warm-up term misses run 1 and run 3
// by residuals r1 and r3 (measured minus estimated); both carry the sky-build
// term and its error, so the warm-up is their difference:
//   warm-up = r1 - r3
// (T1 - T2 - the estimate's sky-build term is printed beside it.)
//
//   npx tsx scripts/warmup-timing.ts [--no-build] [--runs 5] [--port 4192] [--new-browser]

import { build, preview } from 'vite';
import { chromium, type Page } from '@playwright/test';
import { loadavg } from 'node:os';
import { estimateRun } from '../src/core/limits';
import { DEMO_SCENARIO } from '../src/core/demo';
import type { Scenario } from '../src/core/types';

const args = process.argv.slice(2);
const opt = (name: string, dflt: number) => (args.includes(name) ? Number(args[args.indexOf(name) + 1]) || dflt : dflt);
const runs = opt('--runs', 5);
const port = opt('--port', 4192);
const SHIFT = 10 ** (2 / 20);
const shifted = DEMO_SCENARIO.telescope.frequencies_mhz.map((f) => Number((f * SHIFT).toFixed(4)));

function median(a: number[]): number {
  const s = [...a].sort((x, y) => x - y);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
}

const RUNBAR = '[data-testid="runbar"]';

async function lastMsAfter(page: Page, previous: string | null): Promise<number> {
  await page.waitForFunction(([sel, prev]) => {
    const el = document.querySelector(sel as string);
    const v = el?.getAttribute('data-last-ms') ?? '';
    return el?.getAttribute('data-running') === '0' && v !== '' && v !== prev;
  }, [RUNBAR, previous ?? ''], { timeout: 180_000 });
  return Number(await page.locator(RUNBAR).getAttribute('data-last-ms'));
}

async function main(): Promise<void> {
  if (!args.includes('--no-build')) await build({ logLevel: 'warn' });
  const server = await preview({ preview: { port, host: '127.0.0.1', strictPort: true }, logLevel: 'warn' });
  const launch = () => chromium.launch({
    executablePath: process.env.SWATHE_CHROMIUM ?? '/usr/bin/chromium',
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking'],
  });
  // --new-browser: a browser started afresh for every page (no compiled code or HTTP cache shared between pages)
  const perPage = args.includes('--new-browser');
  let browser = await launch();
  const t: [number[], number[], number[]] = [[], [], []];
  const load0 = loadavg()[0];
  try {
    for (let r = 0; r < runs; r++) {
      if (perPage && r > 0) { await browser.close(); browser = await launch(); }
      const context = await browser.newContext({ viewport: { width: 1440, height: 900 } });
      const page = await context.newPage();
      await page.goto(`http://127.0.0.1:${port}/`);
      const t1 = await lastMsAfter(page, null);
      await page.getByRole('button', { name: 'Compute', exact: true }).click();
      const t2 = await lastMsAfter(page, String(t1));
      await page.getByLabel('Update automatically').uncheck();
      for (let i = 0; i < shifted.length; i++) await page.getByLabel(`Frequency ${i + 1} (MHz)`, { exact: true }).fill(String(shifted[i]));
      await page.getByRole('button', { name: 'Compute', exact: true }).click();
      const t3 = await lastMsAfter(page, String(t2));
      t[0].push(t1 / 1000); t[1].push(t2 / 1000); t[2].push(t3 / 1000);
      await context.close();
    }
  } finally {
    await browser.close();
    await new Promise<void>((res) => server.httpServer.close(() => res()));
  }
  const s3: Scenario = { ...DEMO_SCENARIO, telescope: { ...DEMO_SCENARIO.telescope, frequencies_mhz: shifted } };
  const e1 = estimateRun(DEMO_SCENARIO, { skyMapBuilt: () => false });
  const e2 = estimateRun(DEMO_SCENARIO, { skyMapBuilt: () => true });
  const e3 = estimateRun(s3, { skyMapBuilt: () => false });
  const warmUp = t[0].map((t1, i) => (t1 - e1.seconds_estimate) - (t[2][i] - e3.seconds_estimate));
  const simple = t[0].map((t1, i) => t1 - t[1][i] - e1.terms.sky_build_s);
  const f = (a: number[]) => `median ${median(a).toFixed(2)} s  (each: ${a.map((x) => x.toFixed(2)).join(', ')})`;
  console.log(`demo scenario, ${runs} fresh pages${perPage ? ', each in a newly started browser' : ''}, production build, Chromium headless; load average ${load0.toFixed(1)} -> ${loadavg()[0].toFixed(1)} (1 min, 2 cores shared)`);
  console.log(`run 1, first in the page:          ${f(t[0])}; estimate without warm-up ${e1.seconds_estimate.toFixed(2)} s (sky build ${e1.terms.sky_build_s.toFixed(2)} s, ${e1.terms.sky_maps_to_build} maps)`);
  console.log(`run 2, again in the same worker:   ${f(t[1])}; estimate ${e2.seconds_estimate.toFixed(2)} s`);
  console.log(`run 3, warm worker, all maps new:  ${f(t[2])}; estimate ${e3.seconds_estimate.toFixed(2)} s (sky build ${e3.terms.sky_build_s.toFixed(2)} s, ${e3.terms.sky_maps_to_build} maps; frequencies ${shifted.join(', ')} MHz)`);
  console.log(`warm-up = r1 - r3:                 ${f(warmUp)}`);
  console.log(`T1 - T2 - estimated sky build:     ${f(simple)}`);
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});

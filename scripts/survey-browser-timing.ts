// Prints how long the app's site survey takes in Debian's Chromium against the
// production build, beside the panel's estimate before the run (fitted, then
// calibrated by the previous run) and its live projection after about a fifth
// of the sites (not a test: nothing is asserted; issue 9 item 9).
//
//   npx tsx scripts/survey-browser-timing.ts [--no-build]

import { build, preview } from 'vite';
import { chromium } from '@playwright/test';
import { DEMO_SCENARIO } from '../src/core/demo';
import { encodeScenarioParam } from '../src/core/scenario';
import type { Scenario } from '../src/core/types';

const args = process.argv.slice(2);
const port = 4193;
const D = DEMO_SCENARIO;
const cases: [string, Scenario, number][] = [
  ['demo (2 years, nside 128)', D, 15],
  ['one synodic month, nside 64', { ...D, span: { start: '2031-03-01T00:00:00Z', end: '2031-03-30T12:44:00Z', step_min: null }, map: { ...D.map, nside: 64 } }, 5],
];

async function main(): Promise<void> {
  if (!args.includes('--no-build')) await build({ logLevel: 'warn' });
  const server = await preview({ preview: { port, host: '127.0.0.1', strictPort: true }, logLevel: 'warn' });
  const browser = await chromium.launch({ executablePath: process.env.SWATHE_CHROMIUM ?? '/usr/bin/chromium', args: ['--no-sandbox', '--disable-gpu'] });
  try {
    for (const [name, s, step] of cases) {
      const context = await browser.newContext({ viewport: { width: 1440, height: 900 } });
      const page = await context.newPage();
      await page.goto(`http://127.0.0.1:${port}/?s=${encodeScenarioParam(s)}`);
      const panel = page.getByTestId('survey-panel');
      await panel.getByLabel('Survey step (°)').fill(String(step));
      for (let run = 1; run <= 2; run++) {
        const est = panel.locator('[data-wall-s]');
        const estS = Number(await est.getAttribute('data-wall-s'));
        const calibrated = (await est.getAttribute('data-calibrated')) === '1';
        const before = await panel.getByTestId('survey-result').getAttribute('data-ms', { timeout: 100 }).catch(() => null);
        await panel.getByRole('button', { name: 'Run survey' }).click();
        let projected = NaN;
        const live = panel.getByTestId('survey-live');
        for (let k = 0; k < 2000; k++) {
          const f = Number(await panel.getByTestId('survey-progress').getAttribute('value').catch(() => '100'));
          const left = await live.getAttribute('data-left-s').catch(() => null);
          if (f >= 20 && left) { projected = (Number(await live.getAttribute('data-elapsed-ms')) / 1000) + Number(left); break; }
          if (f >= 100) break;
          await page.waitForTimeout(100);
        }
        const res = panel.getByTestId('survey-result');
        // a new result: the previous run's stays on screen until this one replaces it
        await page.waitForFunction((prev) => {
          const el = document.querySelector('[data-testid="survey-result"]');
          return !document.querySelector('[data-testid="survey-live"]') && el !== null && el.getAttribute('data-ms') !== prev;
        }, before, { timeout: 600_000 });
        const real = Number(await res.getAttribute('data-ms')) / 1000;
        const pct = (x: number) => `${x.toFixed(1)} s (${((x / real - 1) * 100).toFixed(0)}%)`;
        console.log(`${name}, ${step}-degree grid, run ${run}: real ${real.toFixed(1)} s; estimate before ${pct(estS)} ${calibrated ? 'calibrated' : 'fitted'}; live projection at 20% ${Number.isFinite(projected) ? pct(projected) : 'n/a'}`);
      }
      await context.close();
    }
  } finally {
    await browser.close();
    await new Promise<void>((r) => server.httpServer.close(() => r()));
  }
}

main().catch((e) => { console.error(e); process.exit(1); });

// Prints how fast the planner shows its first map and redraws on a frequency
// switch, in Debian's Chromium against the production build (not a test:
// nothing is asserted). Goals (issue 4): first map < 2 s, redraw < 50 ms.
//
//   npx tsx scripts/ui-timing.ts [--no-build] [--runs 3]

import { build, preview } from 'vite';
import { chromium } from '@playwright/test';

const args = process.argv.slice(2);
const runs = Number(args[args.indexOf('--runs') + 1] || 3) || 3;
const port = 4191;

function median(a: number[]): number {
  const s = [...a].sort((x, y) => x - y);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
}

async function main(): Promise<void> {
  if (!args.includes('--no-build')) await build({ logLevel: 'warn' });
  const server = await preview({ preview: { port, host: '127.0.0.1', strictPort: true }, logLevel: 'warn' });
  const browser = await chromium.launch({
    executablePath: process.env.SWATHE_CHROMIUM ?? '/usr/bin/chromium',
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking'],
  });
  const first: number[] = [];
  const firstResult: number[] = [];
  const redraw: number[] = [];
  try {
    for (let r = 0; r < runs; r++) {
      const context = await browser.newContext({ viewport: { width: 1440, height: 900 } });
      const page = await context.newPage();
      await page.goto(`http://127.0.0.1:${port}/`);
      const canvas = page.locator('[data-testid="sky-map-canvas"]');
      await canvas.waitFor({ timeout: 120_000 });
      await page.waitForFunction(`Number(document.querySelector('[data-testid="sky-map-canvas"]')?.getAttribute('data-draw-count') ?? 0) >= 1`, null, { timeout: 120_000 });
      // data-drawn-at is performance.now() at the end of the draw: ms since navigation start.
      first.push(Number(await canvas.getAttribute('data-drawn-at')));
      firstResult.push((await page.evaluate(`(performance.getEntriesByName('swathe:first-result')[0] || { startTime: NaN }).startTime`)) as number);
      const nFreq = await page.getByRole('radio').count();
      for (let k = 0; k < 2 * nFreq; k++) {
        const target = (k + 1) % nFreq;
        // In-page code as text: tsx would add helper calls to a compiled function that the page lacks.
        const ms = (await page.evaluate(`(async () => {
          const c = document.querySelector('[data-testid="sky-map-canvas"]');
          const n0 = Number(c.getAttribute('data-draw-count'));
          const radio = document.querySelectorAll('input[type="radio"][name="freq"]')[${target}];
          // Watch before clicking: React may draw synchronously inside the click.
          const drawn = new Promise((res) => {
            const mo = new MutationObserver(() => {
              if (Number(c.getAttribute('data-draw-count')) > n0) { mo.disconnect(); res(); }
            });
            mo.observe(c, { attributes: true });
            setTimeout(() => { if (Number(c.getAttribute('data-draw-count')) > n0) { mo.disconnect(); res(); } }, 0);
          });
          const t0 = performance.now();
          radio.click();
          await drawn;
          return Number(c.getAttribute('data-drawn-at')) - t0;
        })()`)) as number;
        redraw.push(ms);
      }
      await context.close();
    }
  } finally {
    await browser.close();
    await new Promise<void>((res) => server.httpServer.close(() => res()));
  }
  const f = (x: number) => `${Math.round(x)} ms`;
  console.log(`demo scenario, ${runs} fresh page loads at 1440x900, production build, Chromium headless`);
  console.log(`open -> first result from the worker: median ${f(median(firstResult))}  (each: ${firstResult.map(f).join(', ')})`);
  console.log(`open -> first drawn map:   median ${f(median(first))}  (each: ${first.map(f).join(', ')})   goal < 2000 ms`);
  console.log(`frequency switch -> redrawn map: median ${f(median(redraw))}, max ${f(Math.max(...redraw))} over ${redraw.length} switches   goal < 50 ms`);
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});

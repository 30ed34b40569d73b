import { test, expect } from '@playwright/test';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { SHORT, urlFor, guardHosts, waitForMap } from './helpers';

// The app's table and the CLI's summary.json agree for one scenario; every
// control a user needs can be reached with the Tab key.

let outside: string[] = [];
test.beforeEach(async ({ context }) => {
  outside = await guardHosts(context);
});
test.afterEach(() => {
  expect(outside, 'requests to other hosts').toEqual([]);
});

test('the table and summary JSON equal the CLI summary.json for the same scenario', async ({ page }) => {
  const dir = mkdtempSync(join(tmpdir(), 'swathe-e2e-'));
  writeFileSync(join(dir, 'scenario.json'), JSON.stringify(SHORT));
  execFileSync(process.execPath, ['bin/swathe.mjs', 'plan', join(dir, 'scenario.json'), '--out', join(dir, 'out')], { stdio: 'pipe' });
  const cli = JSON.parse(readFileSync(join(dir, 'out', 'summary.json'), 'utf8'));

  await page.goto(urlFor(SHORT));
  await waitForMap(page);
  const [dl] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download summary JSON', exact: true }).click()]);
  const app = JSON.parse(readFileSync(await dl.path(), 'utf8'));
  expect(app.samples).toBe(cli.samples);
  expect(app.hours).toEqual(cli.hours);
  expect(app.galactic).toEqual(cli.galactic);
  for (let i = 0; i < cli.frequencies.length; i++) {
    const c = cli.frequencies[i];
    for (const k of ['mhz', 'sky_fraction_covered', 'exposure_max_h', 'exposure_median_h_covered', 'usable_hours_beam_in_band', 'usable_hours_beam_near_center']) {
      expect(app.frequencies[i][k], `${c.mhz} MHz ${k}`).toBe(c[k]);
    }
    const row = page.getByTestId(`result-row-${i}`);
    expect(Number(await row.getAttribute('data-sky-fraction'))).toBe(c.sky_fraction_covered);
    expect(Number(await row.getAttribute('data-exposure-max'))).toBe(c.exposure_max_h);
  }
});

test('keyboard: Tab reaches the scenario fields, Compute, the map controls, the globe and every download', async ({ page }) => {
  await page.goto(urlFor(SHORT));
  await waitForMap(page);
  await page.locator('body').click({ position: { x: 1, y: 1 } });
  const seen = new Set<string>();
  for (let k = 0; k < 140; k++) {
    await page.keyboard.press('Tab');
    const name = await page.evaluate(() => {
      const el = document.activeElement as HTMLElement | null;
      if (!el || el === document.body) return '';
      const lab = el.getAttribute('aria-label') || (el.id && document.querySelector(`label[for="${el.id}"]`)?.textContent) ||
        el.closest('label')?.textContent || el.textContent || el.getAttribute('data-testid') || el.tagName;
      return `${el.tagName.toLowerCase()}:${(lab ?? '').trim()}`;
    });
    seen.add(name);
  }
  const all = [...seen].join('\n');
  for (const want of [/input:Latitude/, /input:Longitude/, /button:Compute/, /input:.*MHz/, /select:/, /canvas:/, /button:Download PNG/, /button:Download CSV/, /button:Download FITS/, /button:Export scenario JSON/]) {
    expect(all, `reached ${want}`).toMatch(want);
  }
});

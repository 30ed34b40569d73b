import { test, expect } from '@playwright/test';
import { readFileSync } from 'node:fs';
import { SHORT, urlFor, guardHosts, waitForMap, mapHash, drawCount, MAP } from './helpers';

// Phase-2 views: the time scrubber and the A/B comparison.

let outside: string[] = [];
test.beforeEach(async ({ context }) => {
  outside = await guardHosts(context);
});
test.afterEach(() => {
  expect(outside, 'requests to other hosts').toEqual([]);
});

test('the time scrubber shows the moment, its usable flag as in track.csv, and the beam on the map', async ({ page }) => {
  await page.goto(urlFor(SHORT));
  await waitForMap(page);
  const [dl] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download track CSV', exact: true }).click()]);
  const rows = readFileSync(await dl.path(), 'utf8').trimEnd().split(/\r?\n/).slice(1).map((l) => l.split(','));
  const plain = await mapHash(page);
  await page.getByLabel('Time scrubber').check();
  const slider = page.getByLabel('Time in the span');
  for (const i of [Math.floor(rows.length / 3), 0, rows.length - 1]) {
    const n0 = await drawCount(page);
    await slider.fill(String(i));
    await expect(page.getByTestId('scrub-time')).toHaveText(rows[i][0].slice(0, 16).replace('T', ' ') + ' UTC');
    await expect(page.getByTestId('scrub-usable')).toHaveText(rows[i][7] === '1' ? 'usable' : 'not usable');
    await expect.poll(() => drawCount(page)).toBeGreaterThan(n0);
  }
  expect(await mapHash(page)).not.toEqual(plain); // the beam marker is drawn
  await page.getByLabel('Time scrubber').uncheck();
  await expect.poll(() => mapHash(page)).toEqual(plain);
});

test('comparison: the same sky overlaps fully, a moved site shows a difference map', async ({ page }) => {
  await page.goto(urlFor(SHORT));
  await waitForMap(page);
  await page.getByRole('button', { name: 'Pin this result as A' }).click();
  // B = the same plan under another name: every covered pixel is shared.
  await page.getByLabel('Scenario name').fill('Same sky, new name');
  await expect(page.getByTestId('result-title')).toContainText('Same sky, new name', { timeout: 60_000 });
  const rows = page.getByTestId('overlap-table').locator('tbody tr');
  await expect(rows).toHaveCount(SHORT.telescope.frequencies_mhz.length);
  for (let i = 0; i < SHORT.telescope.frequencies_mhz.length; i++) {
    expect(Number(await rows.nth(i).getAttribute('data-overlap'))).toBe(1);
  }
  // B = the site moved 20 degrees north: partial or no overlap, and B - A drawn as a difference.
  await page.getByLabel('Latitude', { exact: true }).fill('-3.5');
  await expect(page.getByTestId('result-title')).toContainText('Moon 3.50° S', { timeout: 60_000 });
  await waitForMap(page);
  for (let i = 0; i < SHORT.telescope.frequencies_mhz.length; i++) {
    expect(Number(await rows.nth(i).getAttribute('data-overlap'))).toBeLessThan(0.5);
  }
  await page.getByLabel('Map B − A').check();
  await expect(page.locator(MAP)).toHaveAttribute('aria-label', /difference/i);
  await page.getByRole('button', { name: 'Unpin A' }).click();
  await expect(page.getByTestId('compare-panel')).toHaveCount(0);
  await expect(page.locator(MAP)).not.toHaveAttribute('aria-label', /difference/i);
});

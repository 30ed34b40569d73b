import { test, expect, type Locator } from '@playwright/test';
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

test('comparison: the targets of A and B side by side, each plan\'s figures as its own targets table gave them; a target only B has is marked on the difference map', async ({ page }) => {
  const n = SHORT.telescope.frequencies_mhz.length;
  // the targets spec's target: on the demo site's zenith track in usable time, so it has hours in the beam
  await page.goto(urlFor({ ...SHORT, targets: [{ name: 'Cold patch, south', l_deg: 230.5, b_deg: 21.9 }] }));
  await waitForMap(page);
  const figures = async (row: Locator) => ({
    hours: await row.getAttribute('data-hours'), exposure: await row.getAttribute('data-exposure'),
    tant: await row.getAttribute('data-tant'), noise: await row.getAttribute('data-noise'),
  });
  const own = (k: number) => page.locator('.results-sec').getByTestId(`target-result-0-${k}`);
  const planA = await Promise.all([...Array(n).keys()].map((k) => figures(own(k))));
  expect(Number(planA[0].hours)).toBeGreaterThan(0);
  await page.getByRole('button', { name: 'Pin this result as A' }).click();
  // B: the site moved 20 degrees north, so the target's figures change
  await page.getByLabel('Latitude', { exact: true }).fill('-3.5');
  await expect(page.getByTestId('result-title')).toContainText('Moon 3.50° S', { timeout: 60_000 });
  await waitForMap(page);
  const planB = await Promise.all([...Array(n).keys()].map((k) => figures(own(k))));
  expect(planB.map((f) => f.hours)).not.toEqual(planA.map((f) => f.hours));
  const table = page.getByTestId('compare-targets-table');
  await expect(table).toContainText('Cold patch, south');
  await expect(page.locator('[data-testid^="compare-target-0-"]')).toHaveCount(n);
  for (let k = 0; k < n; k++) {
    const row = page.getByTestId(`compare-target-0-${k}`);
    await expect(row).toHaveAttribute('data-mhz', String(SHORT.telescope.frequencies_mhz[k]));
    for (const [key, attr] of [['hours', 'hours'], ['exposure', 'exposure'], ['tant', 'tant'], ['noise', 'noise']] as const) {
      await expect(row).toHaveAttribute(`data-${attr}-a`, planA[k][key] ?? '');
      await expect(row).toHaveAttribute(`data-${attr}-b`, planB[k][key] ?? '');
    }
  }
  // a target only B has: its A cells say so, and the difference map marks it beside A's
  await page.getByRole('button', { name: 'Add target' }).click();
  await page.getByLabel('Target 2 name').fill('New in B');
  await page.getByLabel('Target 2 frame').selectOption('eq');
  await page.getByLabel('Target 2 RA (°)').fill('150.25');
  await page.getByLabel('Target 2 Dec (°)').fill('-23.5');
  await expect(page.locator('[data-testid^="compare-target-1-"]')).toHaveCount(n, { timeout: 60_000 });
  await waitForMap(page);
  const added = page.getByTestId('compare-target-1-0');
  await expect(added).toHaveAttribute('data-name', 'New in B');
  await expect(added).toHaveAttribute('data-hours-a', '');
  await expect(added).toContainText('only in B');
  await expect(added).toContainText('n/a');
  await page.getByLabel('Map B − A').check();
  await expect(page.locator(MAP)).toHaveAttribute('aria-label', /difference/i);
  // the difference map is drawn on plan A, which has one target: B's own is marked as well
  await expect(page.getByTestId('sky-map-legend')).toContainText('Targets (2,');
});

import { test, expect, type Page } from '@playwright/test';
import { SHORT, urlFor, guardHosts, waitForMap } from './helpers';
import type { Scenario } from '../../src/core/types';

// What the site globe shows of each body (issue 9 items 4 and 8): the Earth's
// coastlines (bundled world-atlas data: the host guard fails the test on any
// outside request), the Moon's near/far-side boundary and sub-Earth point, and
// on Mars the Earth's direction only where the Earth constraint is on.

let outside: string[] = [];
test.beforeEach(async ({ context }) => {
  outside = await guardHosts(context);
});
test.afterEach(() => {
  expect(outside, 'requests to other hosts').toEqual([]);
});

const GLOBE = '[data-testid="site-globe"]';

async function globeReady(page: Page) {
  const canvas = page.locator(`${GLOBE} canvas`).first();
  await expect(canvas).toHaveAttribute('data-ready', '1', { timeout: 30_000 });
  return canvas;
}

test('the Earth globe draws coastlines', async ({ page }) => {
  const s: Scenario = { ...SHORT, name: 'Earth site', site: { body: 'earth', lat_deg: 40, lon_deg: -100 }, constraints: { ...SHORT.constraints, earth_max_elev_deg: null } };
  await page.goto(urlFor(s));
  await waitForMap(page);
  const canvas = await globeReady(page);
  await expect(canvas).toHaveAttribute('data-features', /coastlines/);
  await expect(page.locator(GLOBE)).toContainText('Coastlines');
});

test('the Moon globe marks the near/far-side boundary and the sub-Earth point', async ({ page }) => {
  await page.goto(urlFor(SHORT));
  await waitForMap(page);
  const canvas = await globeReady(page);
  await expect(canvas).toHaveAttribute('data-features', /near-far-boundary/);
  await expect(canvas).toHaveAttribute('data-features', /sub-earth/);
  await expect(page.locator(GLOBE)).toContainText('Near/far-side boundary');
  await expect(page.locator(GLOBE)).toContainText('Sub-Earth point');
  // The caption gives the sub-Earth point at the moment shown: within the libration (< 8 deg) of 0, 0.
  const cap = await page.locator('.globe-pane figcaption').innerText();
  const m = /Sub-Earth point ([\d.]+)° [NS], ([\d.]+)° [EW]/.exec(cap);
  expect(m, cap).not.toBeNull();
  expect(Number(m![1])).toBeLessThan(8);
  expect(Number(m![2])).toBeLessThan(8);
});

test('Mars shows the Earth direction only where the Earth constraint is on', async ({ page }) => {
  const on: Scenario = { ...SHORT, name: 'Mars site', site: { body: 'mars', lat_deg: 18, lon_deg: 77 }, constraints: { ...SHORT.constraints, earth_max_elev_deg: 0 } };
  await page.goto(urlFor(on));
  await waitForMap(page);
  await globeReady(page);
  await expect(page.locator(GLOBE)).toContainText('Direction of the Earth');
  await expect(page.locator('.globe-pane figcaption')).toContainText(/Earth -?[\d.]+° elevation/);
  const off: Scenario = { ...on, constraints: { ...on.constraints, earth_max_elev_deg: null } };
  await page.goto(urlFor(off));
  await waitForMap(page);
  await globeReady(page);
  await expect(page.locator(GLOBE)).toContainText('Direction of the Sun');
  await expect(page.locator(GLOBE)).not.toContainText('Direction of the Earth');
});

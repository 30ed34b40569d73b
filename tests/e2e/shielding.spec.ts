import { test, expect } from '@playwright/test';
import { urlFor, guardHosts, waitForMap, mapHash, drawCount } from './helpers';
import { DEMO_SCENARIO } from '../../src/core/demo';
import type { Scenario } from '../../src/core/types';

// Issue 13 in the app: the shielding rows of the form (validated with the
// label on screen, kept through edits), usable hours per frequency with the
// geometric figure, each frequency's usable time over the span, and the
// attenuation-against-frequency plot. An invented polar crater site.

let outside: string[] = [];
test.beforeEach(async ({ context }) => {
  outside = await guardHosts(context);
});
test.afterEach(() => {
  expect(outside, 'requests to other hosts').toEqual([]);
});

const CRATER: Scenario = {
  ...DEMO_SCENARIO,
  name: 'Invented polar crater',
  site: { body: 'moon', lat_deg: -88.2, lon_deg: 61 },
  span: { start: '2032-01-01T00:00:00Z', end: '2032-03-01T00:00:00Z', step_min: 60 },
  telescope: { aperture_m: 100, frequencies_mhz: [4, 16, 64], beam: { model: 'gaussian', fwhm_factor: 1.15 } },
  constraints: {
    sun_max_elev_deg: 0, earth_max_elev_deg: 0,
    horizon_mask: [[0, 8], [90, 10], [180, 12], [270, 9]],
    diffraction: { rim_distance_m: 600, min_attenuation_db: 15 },
  },
  map: { ...DEMO_SCENARIO.map, nside: 32 },
};

test('shielding rows, per-frequency usable hours beside the geometric figure, and the plots', async ({ page }) => {
  await page.goto(urlFor(CRATER));
  await waitForMap(page);
  // the rows show the loaded values
  await expect(page.getByLabel('Diffraction over the rim')).toBeChecked();
  await expect(page.getByLabel('Rim distance (m)', { exact: true })).toHaveValue('600');
  await expect(page.getByLabel('Required attenuation (dB)', { exact: true })).toHaveValue('15');
  await expect(page.getByLabel('Ionosphere cut-off (Earth and Mars sites only)')).toBeDisabled();

  // usable hours per frequency, the geometric figure beside them: the rim hides more than diffraction allows
  const usable = async (i: number) => Number(await page.getByTestId(`usable-cell-${i}`).getAttribute('data-usable'));
  const geo = async (i: number) => Number(await page.getByTestId(`usable-cell-${i}`).getAttribute('data-geometric'));
  expect(await usable(0)).toBeLessThan(await geo(0));
  expect(await usable(0)).toBeLessThanOrEqual(await usable(1));
  expect(await usable(1)).toBeLessThanOrEqual(await usable(2));
  expect(await usable(0)).toBeLessThan(await usable(2));
  await expect(page.getByTestId('usable-cell-0')).toContainText(/\d h \([\d,]+ h\)/);
  await expect(page.getByTestId('results-table')).toContainText('Usable (geometric shielding alone)');
  await expect(page.getByTestId('usable-by-frequency')).toBeVisible();
  const plot = page.getByTestId('attenuation-plot');
  await expect(plot).toContainText('required 15 dB');
  await expect(plot.getByTestId('atten-earth')).toContainText(/Earth at -?[\d.]+° elevation/);

  // a bad rim distance: the label on screen and the range; what was typed stays, the last map stays
  const before = await mapHash(page);
  const n0 = await drawCount(page);
  const rim = page.getByLabel('Rim distance (m)', { exact: true });
  await rim.fill('0');
  await expect(page.getByText('"Rim distance (m)" must be a number of metres greater than 0 and at most 1000000, got 0')).toBeVisible();
  await expect(rim).toHaveValue('0');
  await page.getByLabel('Required attenuation (dB)', { exact: true }).fill('250');
  await expect(page.getByText('"Required attenuation (dB)" must be between 0 and 200, got 250')).toBeVisible();
  await page.waitForTimeout(800);
  expect(await drawCount(page)).toBe(n0);
  expect(await mapHash(page)).toBe(before);

  // put them back and edit something else: the diffraction setting survives the edit
  await rim.fill('600');
  await page.getByLabel('Required attenuation (dB)', { exact: true }).fill('15');
  await page.getByLabel('Scenario name', { exact: true }).fill('Invented polar crater (edited)');
  await expect(page.getByTestId('result-title')).toContainText('(edited)', { timeout: 60_000 });
  expect(await usable(0)).toBeLessThan(await geo(0));
  await page.reload();
  await expect(page.getByLabel('Rim distance (m)', { exact: true })).toHaveValue('600');
});

test('ionosphere row on an Earth site and the Sun-from-beam row: labels, ranges, and the cut-off reason', async ({ page }) => {
  const earth: Scenario = {
    ...CRATER, name: 'Invented Earth site', site: { body: 'earth', lat_deg: 40, lon_deg: -100 },
    span: { start: '2032-01-01T00:00:00Z', end: '2032-01-08T00:00:00Z', step_min: null },
    telescope: { aperture_m: 100, frequencies_mhz: [4, 16], beam: { model: 'gaussian', fwhm_factor: 1.15 } },
    constraints: { sun_max_elev_deg: null, earth_max_elev_deg: null, horizon_mask: null, ionosphere: { day_mhz: 10, night_mhz: 3 } },
  };
  await page.goto(urlFor(earth));
  await waitForMap(page);
  await expect(page.getByLabel('Ionosphere cut-off')).toBeChecked();
  // 4 MHz is below the daytime critical frequency: only night time is usable, and the row says why
  await expect(page.getByTestId('usable-notes')).toContainText("4 MHz: below the ionosphere's daytime critical frequency (10 MHz)");
  await page.getByLabel('Critical frequency by day (MHz)', { exact: true }).fill('45');
  await expect(page.getByText('"Critical frequency by day (MHz)" must be between 0 and 30, got 45')).toBeVisible();
  await page.getByLabel('Critical frequency by day (MHz)', { exact: true }).fill('10');
  await page.getByLabel('Sun from every beam at least', { exact: true }).check();
  await page.getByLabel('Sun from every beam at least (degrees)').fill('200');
  await expect(page.getByText('"Sun from every beam at least (°)" must be between 0 and 180, got 200')).toBeVisible();
});

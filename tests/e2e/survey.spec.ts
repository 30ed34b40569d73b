import { test, expect } from '@playwright/test';
import { readFileSync } from 'node:fs';
import { SHORT, urlFor, guardHosts, waitForMap } from './helpers';
import { surveyColumns } from '../../src/core/surveyCsv';
import { surveyGrid } from '../../src/core/survey';

// The site survey panel in Chromium: a coarse (15-degree) survey of a short
// span runs in the survey workers, its layer is drawn on the globe and on the
// flat map, a click on the flat map moves the site in the form, and the CSV
// starts with its column names (details in the JSON beside it) and has one row per grid site.

let outside: string[] = [];
test.beforeEach(async ({ context }) => {
  outside = await guardHosts(context);
});
test.afterEach(() => {
  expect(outside, 'requests to other hosts').toEqual([]);
});

// One frequency keeps the survey short (one synodic month, nside 64).
const ONE = { ...SHORT, name: 'Survey test span', telescope: { ...SHORT.telescope, frequencies_mhz: [8] } };

test('a coarse survey runs, colours the globe and the flat map, picks a site and downloads its CSV', async ({ page }) => {
  await page.goto(urlFor(ONE));
  await waitForMap(page);
  const panel = page.getByTestId('survey-panel');
  await panel.scrollIntoViewIfNeeded();

  // The step is checked before anything runs: outside 1..15 names the range.
  const step = panel.getByLabel('Survey step (°)');
  await step.fill('20');
  await expect(panel.getByTestId('survey-step-msg')).toContainText('from 1 to 15 degrees');
  await expect(panel.getByRole('button', { name: 'Run survey' })).toBeDisabled();
  await step.fill('15');
  await expect(panel.getByTestId('survey-step-msg')).toHaveCount(0);
  // The cost is stated before running: 12 x 24 sites at 15 degrees.
  const grid = surveyGrid(15);
  await expect(panel.getByTestId('survey-estimate')).toContainText(`${grid.count} sites (${grid.nLat} latitudes × ${grid.nLon} longitudes`);

  await panel.getByLabel('Figure shown').selectOption('usable_h');
  await panel.getByRole('button', { name: 'Run survey' }).click();
  // Progress and a cancel button while it runs; the page stays responsive (the form still edits).
  await expect(panel.getByRole('button', { name: 'Cancel survey' })).toBeVisible();
  await page.getByLabel('Scenario name', { exact: true }).fill('Survey test span (renamed)');
  await page.getByLabel('Scenario name', { exact: true }).fill(ONE.name);
  const result = panel.getByTestId('survey-result');
  await expect(result).toBeVisible({ timeout: 90_000 });
  await expect(result).toHaveAttribute('data-sites', String(grid.count));
  await expect(result).toHaveAttribute('data-figure', 'usable_h');
  // Usable hours cannot exceed the span (one synodic month = 708.7 h) and vary over the body.
  const min = Number(await result.getAttribute('data-min'));
  const max = Number(await result.getAttribute('data-max'));
  expect(min).toBeGreaterThanOrEqual(0);
  expect(max).toBeLessThanOrEqual(29.530589 * 24 + 1);
  expect(max).toBeGreaterThan(min);
  await expect(panel.getByTestId('survey-legend')).toContainText('Usable hours (h)');
  await expect(panel.getByTestId('survey-legend')).toContainText(' h');

  // The flat map is drawn with the layer (not the plain body colour: many distinct colours).
  const flat = panel.getByTestId('survey-flat-map').locator('canvas');
  await expect(flat).toHaveAttribute('data-ready', '1');
  const colours = await flat.evaluate((el) => {
    const c = el as HTMLCanvasElement;
    const d = c.getContext('2d')!.getImageData(0, 0, c.width, c.height).data;
    const seen = new Set<number>();
    for (let i = 0; i < d.length; i += 4 * 97) seen.add((d[i] << 16) | (d[i + 1] << 8) | d[i + 2]);
    return seen.size;
  });
  expect(colours).toBeGreaterThan(8);

  // The globe shows the same layer with its value legend (or, without WebGL, its flat fallback does).
  await expect(page.getByTestId('globe-value-legend')).toContainText('Usable hours (h)');

  // Click on the flat map off the centre of the survey cell centred at 37.5 deg S, 97.5 deg E (the cell
  // spans 45-30 deg S, 90-105 deg E; equirectangular: x from 180 W, y from 90 N): the site moves to the
  // cell's centre exactly, not to the point clicked, since the survey's value belongs to the centre.
  const box = (await flat.boundingBox())!;
  await flat.click({ position: { x: box.width * ((102.3 + 180) / 360), y: box.height * ((90 + 32.6) / 180) } });
  await expect(page.getByLabel('Latitude', { exact: true })).toHaveValue('-37.5');
  await expect(page.getByLabel('Longitude', { exact: true })).toHaveValue('97.5');
  await expect(panel.getByTestId('survey-site-value')).toContainText('37.5° S, 97.5° E');

  // Switching the figure needs no new run.
  await panel.getByLabel('Figure shown').selectOption('sky_fraction_covered');
  await expect(result).toHaveAttribute('data-figure', 'sky_fraction_covered');
  await expect(panel.getByTestId('survey-legend')).toContainText('%');

  // The median-noise figure: in kelvin, from the same run (no new survey); sites on the near side see nothing: no value.
  await panel.getByLabel('Figure shown').selectOption('noise_median_k');
  await expect(result).toHaveAttribute('data-figure', 'noise_median_k');
  await expect(panel.getByTestId('survey-legend')).toContainText(/\d (K|mK|µK|nK)\b/);
  await expect(panel.getByTestId('survey-legend')).not.toContainText(/\de[-+]?\d/); // SI prefixes, not exponents
  await expect(panel.getByTestId('survey-legend')).toContainText('no value');
  // values carry their SI-prefixed unit, so the title names none
  await expect(panel.getByTestId('survey-legend').locator('.survey-legend-title')).not.toContainText('(K)');

  // The median antenna temperature (the scenario's sky, galaxy by default): thousands of kelvin at 8 MHz, SI-prefixed.
  await panel.getByLabel('Figure shown').selectOption('t_ant_median_k');
  await expect(result).toHaveAttribute('data-figure', 't_ant_median_k');
  await expect(panel.getByTestId('survey-legend').locator('.survey-legend-title')).toHaveText(/^Median antenna temperature .* at 8 MHz$/);
  await expect(panel.getByTestId('survey-legend')).toContainText(/\d (K|MK)\b/);
  expect(Number(await result.getAttribute('data-max'))).toBeGreaterThan(1e4);

  // The CSV (swathe.survey/3): the column names first, one row per site in grid order; survey.json says what it holds.
  const [dl] = await Promise.all([page.waitForEvent('download'), panel.getByRole('button', { name: 'Download survey CSV' }).click()]);
  expect(dl.suggestedFilename()).toMatch(/\.survey-15deg\.csv$/);
  const lines = ['(metadata in the JSON)', ...readFileSync(await dl.path(), 'utf8').trimEnd().split('\n')];
  expect(lines[1]).toBe(surveyColumns([8]).join(','));
  const [dj] = await Promise.all([page.waitForEvent('download'), panel.getByRole('button', { name: 'Download survey JSON' }).click()]);
  expect(dj.suggestedFilename()).toMatch(/\.survey-15deg\.json$/);
  const meta = JSON.parse(readFileSync(await dj.path(), 'utf8'));
  expect(meta).toMatchObject({ format: 'swathe.survey/3', csv: dl.suggestedFilename(), body: 'moon', frequencies_mhz: [8],
    grid: { kind: 'cell-centres', step_deg: 15, nlat: 12, nlon: 24, sites: 288 }, columns: surveyColumns([8]), shard: null });
  const rows = lines.slice(2).map((l) => l.split(','));
  expect(rows.length).toBe(grid.count);
  const col = (name: string) => surveyColumns([8]).indexOf(name);
  rows.forEach((r, k) => {
    expect(Number(r[col('site')])).toBe(k);
    expect(Number(r[col('lat_deg')])).toBeCloseTo(grid.lat_deg[Math.floor(k / grid.nLon)], 5);
    expect(Number(r[col('lon_deg')])).toBeCloseTo(grid.lon_deg[k % grid.nLon], 5);
  });
  // The layer's range is the CSV column's range.
  const usable = rows.map((r) => Number(r[col('usable_h')]));
  expect(Math.min(...usable)).toBeCloseTo(min, 2);
  expect(Math.max(...usable)).toBeCloseTo(max, 2);
});

// Any antenna (issue 11 item 6): a dipole over ground runs the plan's own stages at every site.
const DIPOLE = {
  ...ONE, name: 'Survey test dipole',
  span: { start: '2031-03-01T00:00:00Z', end: '2031-03-04T00:00:00Z', step_min: null },
  telescope: { frequencies_mhz: [8], beam: { model: 'dipole' as const, fwhm_factor: 1.15, length_m: 5, height_m: 1.5 } },
  map: { ...ONE.map, nside: 16 },
};

test('a dipole over ground is surveyed (the plan\'s stages per site), with its median antenna temperature', async ({ page }) => {
  test.setTimeout(300_000);
  await page.goto(urlFor(DIPOLE));
  await waitForMap(page);
  const panel = page.getByTestId('survey-panel');
  await panel.scrollIntoViewIfNeeded();
  await panel.getByLabel('Survey step (°)').fill('15');
  // the estimate says this antenna takes the slower general path
  await expect(panel.getByTestId('survey-general-note')).toContainText('not the zenith-pointing circular dish');
  await panel.getByLabel('Figure shown').selectOption('t_ant_median_k');
  await panel.getByRole('button', { name: 'Run survey' }).click();
  const result = panel.getByTestId('survey-result');
  await expect(result).toBeVisible({ timeout: 240_000 });
  await expect(panel.getByTestId('survey-error')).toHaveCount(0);
  await expect(result).toHaveAttribute('data-sites', '288');
  // a wide dipole sees the sky, galaxy model, at 8 MHz: hundreds of thousands of kelvin, varying over the body
  const min = Number(await result.getAttribute('data-min')), max = Number(await result.getAttribute('data-max'));
  expect(min).toBeGreaterThan(1e4);
  expect(max).toBeGreaterThan(min);
  await expect(panel.getByTestId('survey-legend')).toContainText(/\d (K|MK)\b/);
  await panel.getByLabel('Figure shown').selectOption('sky_fraction_covered');
  expect(Number(await result.getAttribute('data-max'))).toBeGreaterThan(0.1); // a wide beam covers much of the sky
});

test('a survey can be cancelled and the page keeps working', async ({ page }) => {
  await page.goto(urlFor(ONE));
  await waitForMap(page);
  const panel = page.getByTestId('survey-panel');
  await panel.getByLabel('Survey step (°)').fill('5');
  await expect(panel.getByTestId('survey-estimate')).toContainText('2,592 sites');
  await panel.getByRole('button', { name: 'Run survey' }).click();
  await expect(panel.getByTestId('survey-progress')).toBeVisible();
  await panel.getByRole('button', { name: 'Cancel survey' }).click();
  await expect(panel.getByTestId('survey-estimate')).toContainText('Survey cancelled');
  await expect(panel.getByRole('button', { name: 'Run survey' })).toBeEnabled();
  await expect(panel.getByTestId('survey-result')).toHaveCount(0);
});

test('comparison outlines use the engine\'s covered masks: drawn with the first redraw, never pending', async ({ page }) => {
  await page.goto(urlFor(SHORT));
  await waitForMap(page);
  const map = page.locator('[data-testid="sky-map-canvas"]').first();
  const n0 = Number(await map.getAttribute('data-draw-count'));
  await page.getByLabel('Compare all frequencies').check();
  await expect(map).toHaveAttribute('data-compare', '1');
  // The first draw in compare mode already has the outlines (no "Computing the half-power outlines" pass).
  expect(Number(await map.getAttribute('data-draw-count'))).toBe(n0 + 1);
  await expect(map).toHaveAttribute('data-pending', '0');
  await expect(page.getByText('Computing the half-power outlines')).toHaveCount(0);
});

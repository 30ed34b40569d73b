import { test, expect, type Page } from '@playwright/test';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { SHORT, urlFor, guardHosts, waitForMap, mapHash, MAP } from './helpers';
import type { Scenario } from '../../src/core/types';

// The antenna section of the form, the beam figures in the table against
// `swathe plan`, the beam view, the half-power outline on the sky map, the
// comparison and every download with a dipole and with a fan beam; a bad
// value gets a message naming its label and keeps what was typed.

let outside: string[] = [];
test.beforeEach(async ({ context }) => {
  outside = await guardHosts(context);
});
test.afterEach(() => {
  expect(outside, 'requests to other hosts').toEqual([]);
});

/** An invented Earth site with a fan beam tilted south and a second feed. */
const FAN: Scenario = {
  format: 'swathe.scenario/1',
  name: 'Invented fan beam',
  site: { body: 'earth', lat_deg: 41.5, lon_deg: -7.25 },
  span: { start: '2031-06-01T00:00:00Z', end: '2031-06-03T00:00:00Z', step_min: 10 },
  telescope: {
    frequencies_mhz: [150, 300],
    beam: { model: 'elliptical_gaussian', length_m: 40, width_m: 8, fwhm_factor: 1.15, axis_azimuth_deg: 0 },
    pointing: { elevation_deg: 70, azimuth_deg: 180 },
    feeds: [{ x_offset_deg: 8, y_offset_deg: 0 }],
  },
  constraints: { sun_max_elev_deg: null, earth_max_elev_deg: null, horizon_mask: null },
  map: { nside: 64, galactic_band_deg: 10, galactic_center_radius_deg: 10 },
};

function cliSummary(scenarioText: string): { frequencies: { mhz: number; fwhm_deg: number; sky_fraction_covered: number; exposure_max_h: number; beam: Record<string, number> }[] } {
  const dir = mkdtempSync(join(tmpdir(), 'swathe-e2e-antenna-'));
  writeFileSync(join(dir, 'scenario.json'), scenarioText);
  execFileSync(process.execPath, ['bin/swathe.mjs', 'plan', join(dir, 'scenario.json'), '--out', join(dir, 'out')], { stdio: 'pipe' });
  return JSON.parse(readFileSync(join(dir, 'out', 'summary.json'), 'utf8'));
}

async function download(page: Page, name: string): Promise<string> {
  const [dl] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name, exact: true }).click()]);
  const p = await dl.path();
  expect(statSync(p).size, `${name} is not empty`).toBeGreaterThan(0);
  return p;
}

/** The main results table's rows (the comparison repeats the table for A and B). */
const mainRow = (page: Page, i: number) => page.locator('.results-sec').getByTestId(`result-row-${i}`);

async function tableMatchesCli(page: Page, cli: ReturnType<typeof cliSummary>): Promise<void> {
  for (let i = 0; i < cli.frequencies.length; i++) {
    const c = cli.frequencies[i];
    const row = mainRow(page, i);
    expect(Number(await row.getAttribute('data-mhz'))).toBe(c.mhz);
    // The same code in the browser's worker and in Node; the browser's Math.sin/cos may differ from
    // Node's in the last bit, which a sum of a million terms carries into the last digit or two.
    for (const [attr, key] of [['data-fwhm-major', 'fwhm_major_deg'], ['data-fwhm-minor', 'fwhm_minor_deg'], ['data-solid-angle', 'solid_angle_sr'], ['data-directivity', 'directivity_dbi']]) {
      const v = Number(await row.getAttribute(attr));
      expect(Math.abs(v - c.beam[key]), `${c.mhz} MHz ${key}: app ${v}, CLI ${c.beam[key]}`).toBeLessThanOrEqual(1e-12 * Math.abs(c.beam[key]));
    }
    expect(Number(await row.getAttribute('data-sky-fraction'))).toBe(c.sky_fraction_covered);
    expect(Number(await row.getAttribute('data-exposure-max'))).toBe(c.exposure_max_h);
    // what the cells show is those numbers rounded
    await expect(row).toContainText(`${c.beam.directivity_dbi.toFixed(2)} dBi`);
  }
}

/** Every download works and the summary JSON's beam figures are the CLI's. */
async function exportsWork(page: Page, cli: ReturnType<typeof cliSummary>): Promise<void> {
  const png = readFileSync(await download(page, 'Download PNG'));
  expect([...png.subarray(1, 4)].map((c) => String.fromCharCode(c)).join('')).toBe('PNG');
  const csv = readFileSync(await download(page, 'Download CSV'), 'utf8');
  expect(csv.split('\n')[0]).toMatch(/^pixel,/);
  const track = readFileSync(await download(page, 'Download track CSV'), 'utf8');
  expect(track.split('\n')[0]).toMatch(/^utc,/);
  const fits = readFileSync(await download(page, 'Download FITS'));
  expect(fits.subarray(0, 6).toString('latin1')).toBe('SIMPLE');
  const summary = JSON.parse(readFileSync(await download(page, 'Download summary JSON'), 'utf8'));
  for (let i = 0; i < cli.frequencies.length; i++) {
    for (const [k, v] of Object.entries(cli.frequencies[i].beam)) expect(Math.abs(summary.frequencies[i].beam[k] - v), k).toBeLessThanOrEqual(1e-12 * Math.abs(v));
  }
}

test('a dipole set in the form: beam figures equal swathe plan, beam view, outline on the map, comparison and every export', async ({ page }) => {
  await page.goto(urlFor(SHORT));
  await waitForMap(page);
  await page.getByRole('button', { name: 'Pin this result as A' }).click();

  await page.getByLabel('Beam model').selectOption('dipole');
  await page.getByLabel('Dipole length (m)').fill('12');
  await page.getByLabel('Height over ground (m)').fill('6');
  await expect(page.getByTestId('result-title')).toContainText('12 m dipole', { timeout: 60_000 });
  await waitForMap(page);

  // the same scenario through the CLI, as the app exports it
  const scenarioText = readFileSync(await download(page, 'Export scenario JSON'), 'utf8');
  const exported = JSON.parse(scenarioText);
  expect(exported.telescope.beam).toMatchObject({ model: 'dipole', length_m: 12, height_m: 6, axis_azimuth_deg: 90 });
  expect(exported.telescope.aperture_m).toBeUndefined();
  const cli = cliSummary(scenarioText);
  await tableMatchesCli(page, cli);

  // beam view: both principal planes, one curve per frequency, the half-power level marked
  for (const cut of ['beam-cut-1', 'beam-cut-2']) {
    await expect(page.getByTestId(cut).locator('path[data-mhz]')).toHaveCount(SHORT.telescope.frequencies_mhz.length);
    await expect(page.getByTestId(`${cut}-half`)).toHaveCount(1);
  }
  await expect(page.getByTestId('beam-cut-1')).toContainText('E-plane');

  // comparison of the dish (A) and the dipole (B)
  await expect(page.getByTestId('overlap-table').locator('tbody tr')).toHaveCount(SHORT.telescope.frequencies_mhz.length);
  await page.getByLabel('Map B − A').check();
  await expect(page.locator(MAP)).toHaveAttribute('aria-label', /difference/i);
  await page.getByLabel('Map B − A').uncheck();

  // the scrubber draws the dipole's half-power outline, not a circle
  const plain = await mapHash(page);
  await page.getByLabel('Time scrubber').check();
  await expect(page.getByText(/Beam at the chosen time \(half-power outline\)/)).toBeVisible();
  await expect.poll(() => mapHash(page)).not.toEqual(plain);

  await exportsWork(page, cli);

  // a reload keeps every antenna field (the scenario is saved as typed)
  await page.goto('./');
  await expect(page.getByLabel('Dipole length (m)')).toHaveValue('12');
  await expect(page.getByLabel('Height over ground (m)')).toHaveValue('6');
});

test('a fan beam with a tilt and two feeds from a link: figures equal swathe plan, outlines of both feeds, every export', async ({ page }) => {
  await page.goto(urlFor(FAN));
  await waitForMap(page);
  await expect(page.getByLabel('Beam model')).toHaveValue('elliptical_gaussian');
  await expect(page.getByLabel('Length (m)', { exact: true })).toHaveValue('40');
  await expect(page.getByLabel('Boresight elevation (°)')).toHaveValue('70');
  await expect(page.getByLabel('Extra feed 1 x offset (°)')).toHaveValue('8');
  await tableMatchesCli(page, cliSummary(JSON.stringify(FAN)));
  await expect(page.getByTestId('beam-cut-1')).toContainText('Along the long side');
  await page.getByLabel('Time scrubber').check();
  await expect(page.getByText(/half-power outline of each of 2 feeds/)).toBeVisible();
  await exportsWork(page, cliSummary(JSON.stringify(FAN)));
});

test('a bad antenna value is named by its label with the range, and what was typed stays', async ({ page }) => {
  await page.goto(urlFor(SHORT));
  await waitForMap(page);
  await page.getByLabel('Beam model').selectOption('dipole');
  await expect(page.getByTestId('result-title')).toContainText('dipole', { timeout: 60_000 });
  await waitForMap(page);

  const height = page.getByLabel('Height over ground (m)');
  await height.fill('-2');
  await expect(page.getByRole('alert').filter({ hasText: '"Height over ground (m)" must be a number of metres between 0 and 10000 (or untick "Over a perfectly conducting ground"), got -2' })).toBeVisible();
  await expect(height).toHaveValue('-2');
  await expect(height).toHaveAttribute('aria-invalid', 'true');
  await expect(page.getByTestId('result-title')).toContainText('dipole'); // the last good result stays

  await page.getByRole('button', { name: 'Add feed' }).click();
  const x = page.getByLabel('Extra feed 1 x offset (°)');
  await x.fill('75');
  await expect(page.getByRole('alert').filter({ hasText: '"Extra feed 1 x offset (°)" must be between -60 and 60, got 75' })).toBeVisible();
  await expect(x).toHaveValue('75');

  // a pattern table that does not load leaves the model's state alone and says why
  await page.getByLabel('Beam model').selectOption('pattern');
  // with no table yet the summary line is the field's problem, styled as every other field message (colour and size)
  const summary = page.getByTestId('pattern-summary');
  await expect(summary).toHaveAttribute('role', 'alert');
  await expect(summary).toContainText('No pattern table yet: load one from a CSV file (nothing is computed until one is loaded).');
  const look = (el: Element) => { const c = getComputedStyle(el); return `${c.color} ${c.fontSize}`; };
  const feedMsg = page.getByRole('alert').filter({ hasText: '"Extra feed 1 x offset (°)"' });
  expect(await summary.evaluate(look)).toBe(await feedMsg.evaluate(look));
  expect(await summary.evaluate((el) => getComputedStyle(el).color)).toBe('rgb(179, 38, 30)'); // --error, #b3261e in styles.css
  await page.getByLabel('Pattern table CSV file').setInputFiles({ name: 'holes.csv', mimeType: 'text/csv', buffer: Buffer.from('frequency_mhz,zenith_deg,azimuth_deg,gain_db\n8,0,0,0\n8,0,90,0\n8,90,0,-3\n') });
  await expect(page.getByRole('alert').filter({ hasText: 'holes.csv was not loaded' })).toContainText('no gain for frequency 8 MHz, zenith 90°, azimuth 90°');
  await page.getByLabel('Pattern table CSV file').setInputFiles({ name: 'flat.csv', mimeType: 'text/csv', buffer: Buffer.from('frequency_mhz,zenith_deg,azimuth_deg,gain_db\n5,0,0,0\n5,90,0,-6\n20,0,0,0\n20,90,0,-9\n') });
  await expect(page.getByTestId('pattern-summary')).toContainText('from flat.csv: 2 frequencies (5–20 MHz)');
  // and going back to the dipole finds the typed values as they were
  await page.getByLabel('Beam model').selectOption('dipole');
  await expect(page.getByLabel('Height over ground (m)')).toHaveValue('-2');
});

test('switching the beam model and back gives back what was typed, also after a reload', async ({ page }) => {
  await page.goto(urlFor(SHORT));
  await waitForMap(page);
  await page.getByLabel('Aperture (m)').fill('77');
  await page.getByLabel('FWHM factor k').fill('1.3');
  await page.getByLabel('Beam model').selectOption('elliptical_gaussian');
  // the starting short side gives at most a 90° beam at 8 MHz: k λ / (π/2) = 1.3 × 37.47 m / 1.571 = 31.0 m, rounded up to 32 m
  // (FWHM = k λ / size, the model's formula in README; λ = c / f with c = 299 792 458 m/s)
  await expect(page.getByLabel('Width (m)')).toHaveValue('32');
  await expect(page.getByLabel('Width (m)')).not.toHaveAttribute('aria-invalid', 'true');
  await expect(page.getByLabel('Length (m)')).toHaveValue('77');
  await page.getByLabel('Length (m)').fill('120');
  await page.getByLabel('Width (m)').fill('40.5');
  await page.getByLabel('Beam model').selectOption('dipole');
  await page.getByLabel('Dipole length (m)').fill('9');
  await page.getByLabel('Height over ground (m)').fill('4');
  await expect(page.getByTestId('result-title')).toContainText('9 m dipole', { timeout: 60_000 });
  // the dipole scenario as saved carries no aperture (it does not use one)
  const saved = JSON.parse(readFileSync(await download(page, 'Export scenario JSON'), 'utf8'));
  expect(saved.telescope.aperture_m).toBeUndefined();
  await page.reload();
  await waitForMap(page);
  await expect(page.getByLabel('Dipole length (m)')).toHaveValue('9');
  await page.getByLabel('Beam model').selectOption('elliptical_gaussian');
  await expect(page.getByLabel('Length (m)')).toHaveValue('120');
  await expect(page.getByLabel('Width (m)')).toHaveValue('40.5');
  await page.getByLabel('Beam model').selectOption('gaussian');
  await expect(page.getByLabel('Aperture (m)')).toHaveValue('77');
  await expect(page.getByLabel('FWHM factor k')).toHaveValue('1.3');
  await expect(page.getByTestId('result-title')).toContainText('77 m', { timeout: 60_000 });
});

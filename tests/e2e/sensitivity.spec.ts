import { test, expect } from '@playwright/test';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { execFileSync } from 'node:child_process';
import { SHORT, urlFor, guardHosts, waitForMap, drawCount, mapHash, MAP } from './helpers';
import type { Scenario } from '../../src/core/types';

// Sensitivity in Chromium: the Bandwidth and Receiver temperature inputs are
// validated like every field, the table's "Noise (K)" column equals the CLI's
// summary.json noise_median_k for the same scenario, and the sky map draws the
// noise map with a colour bar in kelvin, next to the sky model's label and the
// galactic-plane warning.

let outside: string[] = [];
test.beforeEach(async ({ context }) => {
  outside = await guardHosts(context);
});
test.afterEach(() => {
  expect(outside, 'requests to other hosts').toEqual([]);
});

/** summary.json of `swathe plan` (the CLI, a separate process) for the scenario. */
function cliSummary(s: Scenario): { frequencies: { mhz: number; noise_median_k: number | null }[]; sensitivity: { bandwidth_mhz: number; receiver_temp_k: number } } {
  const dir = mkdtempSync(join(tmpdir(), 'swathe-sens-'));
  writeFileSync(join(dir, 'scenario.json'), JSON.stringify(s));
  execFileSync(process.execPath, ['bin/swathe.mjs', 'plan', join(dir, 'scenario.json'), '--out', join(dir, 'out'), '--quiet'], { stdio: 'pipe' });
  return JSON.parse(readFileSync(join(dir, 'out', 'summary.json'), 'utf8'));
}

test('bandwidth and receiver temperature: validated, used, and the noise column equals the CLI summary', async ({ page }) => {
  await page.goto(urlFor(SHORT));
  await waitForMap(page);
  const bw = page.getByLabel('Bandwidth (MHz)', { exact: true });
  const rx = page.getByLabel('Receiver temperature (K)', { exact: true });
  // Empty fields show the defaults as placeholders.
  await expect(bw).toHaveAttribute('placeholder', '1');
  await expect(rx).toHaveAttribute('placeholder', '100');

  // A bad value names the field and its range, and the last map stays.
  const before = await mapHash(page);
  await bw.fill('-2');
  // in the app the message names the label on screen (issue 9 item 3); the CLI keeps telescope.bandwidth_mhz
  await expect(page.getByText('"Bandwidth (MHz)" must be between 0.000001 and 100000, got -2').first()).toBeVisible();
  await expect(page.getByText(/telescope\.bandwidth_mhz/)).toHaveCount(0);
  await expect(bw).toHaveAttribute('aria-invalid', 'true');
  expect(await mapHash(page)).toBe(before);

  // Valid values: recomputed automatically; the column matches the CLI for that scenario.
  const n0 = await drawCount(page);
  await bw.fill('0.25');
  await rx.fill('40');
  await expect(bw).toHaveAttribute('aria-invalid', 'false');
  await expect(page.getByTestId('noise-note')).toContainText('bandwidth of 0.25 MHz and a receiver temperature of 40 K', { timeout: 60_000 });
  await waitForMap(page, n0 + 1);
  const scen: Scenario = { ...SHORT, telescope: { ...SHORT.telescope, bandwidth_mhz: 0.25, receiver_temp_k: 40 } };
  const cli = cliSummary(scen);
  expect(cli.sensitivity.bandwidth_mhz).toBe(0.25);
  expect(cli.sensitivity.receiver_temp_k).toBe(40);
  for (let i = 0; i < SHORT.telescope.frequencies_mhz.length; i++) {
    const row = page.getByTestId(`result-row-${i}`);
    const want = cli.frequencies[i].noise_median_k;
    expect(want).not.toBeNull();
    // The row carries the full number; the cell shows 4 significant digits of it.
    const got = Number(await row.getAttribute('data-noise-median'));
    expect(got).toBeCloseTo(want!, 10);
    // SI prefixes (issue 9 item 9): K at 1 K and above, mK from 1e-3 K, µK from 1e-6 K
    const [k, unit] = want! >= 1 ? [1, 'K'] : want! >= 1e-3 ? [1e3, 'mK'] : want! >= 1e-6 ? [1e6, 'µK'] : [1e9, 'nK'];
    await expect(page.getByTestId(`noise-cell-${i}`)).toHaveText(`${Number((want! * k).toPrecision(4)).toLocaleString('en-US', { maximumFractionDigits: 10 })} ${unit}`);
  }
  // The radiometer equation (Dicke 1946) scales as T_sys / sqrt(bandwidth): against the defaults (1 MHz, 100 K) the ratio is below.
  // With a uniform sky T_sys is the same at every sample: the Cane (1979) spectrum as written by
  // Dulk et al. (2001, A&A 365, 294, eq. 1) at 8 MHz plus the CMB (2.7255 K, Fixsen 2009), written out here.
  const uniform = { model: 'uniform' as const };
  const cliU = cliSummary({ ...scen, sky: uniform });
  const cliDefault = cliSummary({ ...SHORT, sky: uniform });
  const nu = 8, tau = 5.0 * Math.pow(nu, -2.1);
  const I = 2.48e-20 * Math.pow(nu, -0.52) * (1 - Math.exp(-tau)) / tau + 1.06e-20 * Math.pow(nu, -0.8) * Math.exp(-tau);
  const tSky8 = (I * 299792458 ** 2) / (2 * 1.380649e-23 * (nu * 1e6) ** 2) + 2.7255;
  const ratio = ((tSky8 + 40) / Math.sqrt(0.25)) / ((tSky8 + 100) / Math.sqrt(1));
  expect(cliU.frequencies[0].noise_median_k! / cliDefault.frequencies[0].noise_median_k!).toBeCloseTo(ratio, 4);
});

test('the sky map draws the noise map in kelvin, with the sky model and what it leaves out', async ({ page }) => {
  await page.goto(urlFor(SHORT));
  await waitForMap(page);
  const map = page.locator(MAP).first();
  await expect(map).toHaveAttribute('data-quantity', 'exposure');
  const exposureHash = await mapHash(page);
  const n0 = await drawCount(page);
  await page.getByLabel('Map shows').selectOption('noise');
  await expect.poll(() => drawCount(page)).toBeGreaterThan(n0);
  await expect(map).toHaveAttribute('data-quantity', 'noise');
  await expect(map).toHaveAttribute('aria-label', /radiometer noise \(K\) at 8 MHz/);
  expect(await mapHash(page)).not.toEqual(exposureHash);
  const bar = page.getByTestId('sky-map-colourbar');
  await expect(bar).toHaveAttribute('data-unit', 'K');
  // SI prefixes, never exponent notation (issue 9 item 9)
  await expect(bar).toHaveAttribute('aria-label', /^Noise σ_T \((K|mK|µK)\): from [\d.,]+ (K|mK|µK|nK) to [\d.,]+ (K|mK|µK|nK)/);
  expect(await bar.getAttribute('aria-label')).not.toMatch(/\de[-+]?\d/);
  // Unobserved sky stays grey: the map's corners inside the ellipse far from the strip are ZERO_RGBA (214,214,214).
  const greyShare = await map.evaluate((el) => {
    const c = el as HTMLCanvasElement;
    const d = c.getContext('2d')!.getImageData(0, 0, c.width, c.height).data;
    let grey = 0, sky = 0;
    for (let i = 0; i < d.length; i += 4 * 13) {
      if (d[i + 3] === 0) continue;
      sky++;
      if (d[i] === 214 && d[i + 1] === 214 && d[i + 2] === 214) grey++;
    }
    return grey / sky;
  });
  expect(greyShare).toBeGreaterThan(0.05);
  // The model is stated beside the figures (texts from core/stats.ts, as in summary.json).
  // the default sky model, galaxy, and what it leaves out
  await expect(page.getByTestId('noise-note')).toContainText('galaxy: analytic synchrotron disks');
  await expect(page.getByTestId('noise-warning')).toContainText('discrete sources');
  // The PNG of the noise figure says so in its file name and is a PNG (signature, ISO/IEC 15948) at least 1600 px wide.
  const [dl] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download PNG', exact: true }).click()]);
  expect(dl.suggestedFilename()).toMatch(/-8mhz-noise-equatorial\.png$/);
  const png = readFileSync(await dl.path());
  expect(png.subarray(0, 8).toString('hex')).toBe('89504e470d0a1a0a');
  expect(png.readUInt32BE(16)).toBeGreaterThanOrEqual(1600);
  // Back to exposure: the first drawing again.
  await page.getByLabel('Map shows').selectOption('exposure');
  await expect(map).toHaveAttribute('data-quantity', 'exposure');
  expect(await mapHash(page)).toEqual(exposureHash);
});

import { test, expect } from '@playwright/test';
import { SHORT, urlFor, guardHosts, waitForMap, drawCount } from './helpers';
import { HI_REST_MHZ } from '../../src/core/beam';

// The scenario panel's inputs: redshift entry, horizon-mask CSV, import,
// the estimate before a long run, and a full local storage.

let outside: string[] = [];
test.beforeEach(async ({ context }) => {
  outside = await guardHosts(context);
});
test.afterEach(() => {
  expect(outside, 'requests to other hosts').toEqual([]);
});

test('a 21-cm redshift typed in place of a frequency sets the frequency', async ({ page }) => {
  await page.goto(urlFor(SHORT));
  await waitForMap(page);
  await page.getByLabel('Redshift 1 (21-cm line)').fill('100');
  // f = f_rest / (1 + z), f_rest = 1420.405751768 MHz (IAU)
  const want = HI_REST_MHZ / 101;
  await expect.poll(async () => Number(await page.getByLabel('Frequency 1 (MHz)').inputValue())).toBeCloseTo(want, 5);
  await expect(page.getByTestId('result-row-0')).toHaveAttribute('data-mhz', /^14\.06/, { timeout: 60_000 });
});

test('a horizon mask loaded from CSV lengthens the usable time (terrain hides the Sun)', async ({ page }) => {
  await page.goto(urlFor(SHORT));
  await waitForMap(page);
  const usable0 = Number((await page.locator('.table-cap').first().textContent())!.match(/([\d,.]+) h usable/)![1].replace(/,/g, ''));
  await page.getByLabel('Horizon mask (terrain above the flat horizon)').check();
  // A 30-degree wall all round. Constraints are measured above the mask (ARCHITECTURE §3), so the Sun counts as
  // down until it clears the wall: the usable night gets longer.
  const csv = 'azimuth_deg,elevation_deg\n0,30\n90,30\n180,30\n270,30\n';
  await page.getByLabel('Horizon mask CSV file').setInputFiles({ name: 'wall.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
  await expect(page.getByText('Loaded 4 points from wall.csv.')).toBeVisible();
  await expect(page.getByLabel('Mask point 4 elevation (degrees)')).toHaveValue('30');
  const n0 = await drawCount(page);
  await waitForMap(page, n0 + 1);
  const usable1 = Number((await page.locator('.table-cap').first().textContent())!.match(/([\d,.]+) h usable/)![1].replace(/,/g, ''));
  expect(usable1).toBeGreaterThan(usable0);
  // A bad CSV is refused with the line named, and the points stay.
  await page.getByLabel('Horizon mask CSV file').setInputFiles({ name: 'bad.csv', mimeType: 'text/csv', buffer: Buffer.from('0,30\n90,abc\n') });
  await expect(page.getByText(/bad\.csv was not loaded/)).toBeVisible();
  await expect(page.getByLabel('Mask point 4 elevation (degrees)')).toHaveValue('30');
});

test('importing a scenario file replaces the scenario and computes it', async ({ page }) => {
  await page.goto(urlFor(SHORT));
  await waitForMap(page);
  const other = { ...SHORT, name: 'Imported plan', site: { body: 'mars', lat_deg: 18.4, lon_deg: 77.5 }, constraints: { ...SHORT.constraints, earth_max_elev_deg: null } };
  await page.getByLabel('Scenario JSON file').setInputFiles({ name: 'plan.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(other)) });
  await expect(page.getByTestId('result-title')).toContainText('Imported plan', { timeout: 60_000 });
  await expect(page.getByTestId('result-title')).toContainText('Mars 18.40° N, 77.50° E');
  await expect(page.getByLabel('Body')).toHaveValue('mars');
});

test('a long run shows its estimate and waits for Compute', async ({ page }) => {
  await page.goto(urlFor(SHORT));
  await waitForMap(page);
  const n0 = await drawCount(page);
  await page.getByLabel('HEALPix nside').selectOption('1024');
  for (let i = 0; i < 6; i++) await page.getByRole('button', { name: 'Add frequency' }).click();
  await expect(page.getByTestId('runbar')).toContainText(/Estimate: .* samples .* about .* Press Compute to run it\./);
  await page.waitForTimeout(1000);
  await expect(page.getByTestId('runbar')).toHaveAttribute('data-running', '0');
  expect(await drawCount(page)).toBe(n0);
});

test('a full local storage gets a notice and the app goes on', async ({ page }) => {
  await page.addInitScript(() => {
    Storage.prototype.setItem = function () { throw new DOMException('quota', 'QuotaExceededError'); };
  });
  await page.goto(urlFor(SHORT));
  await waitForMap(page);
  await expect(page.getByTestId('notices')).toContainText(/could not be saved in local storage/);
  await page.getByLabel('Latitude', { exact: true }).fill('-30');
  await expect(page.getByTestId('result-title')).toContainText('30.00° S', { timeout: 60_000 });
  expect(new URL(page.url()).searchParams.get('s')).toBeTruthy(); // the link still holds the scenario
});

import { test, expect } from '@playwright/test';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Scenario } from '../../src/core/types';
import { SHORT, urlFor, guardHosts, waitForMap } from './helpers';

// Targets (issue 12 item 5): a target added in the panel reaches the run, its
// rows appear in the results' targets table and in the downloaded targets.csv,
// which is byte-identical to what `swathe plan` writes for the same scenario.
// A target outside the sky is refused by its on-screen label and range, and
// the other edits stay.

let outside: string[] = [];
test.beforeEach(async ({ context }) => {
  outside = await guardHosts(context);
});
test.afterEach(() => {
  expect(outside, 'requests to other hosts').toEqual([]);
});

function cliTargetsCsv(s: Scenario): string {
  const dir = mkdtempSync(join(tmpdir(), 'swathe-e2e-targets-'));
  writeFileSync(join(dir, 'scenario.json'), JSON.stringify(s));
  execFileSync(process.execPath, ['bin/swathe.mjs', 'plan', join(dir, 'scenario.json'), '--out', join(dir, 'out')], { stdio: 'pipe' });
  return readFileSync(join(dir, 'out', 'targets.csv'), 'utf8');
}

test('a target added in the panel shows in the targets table and in targets.csv, equal to the CLI file', async ({ page }) => {
  await page.goto(urlFor(SHORT));
  await waitForMap(page);
  await expect(page.getByTestId('targets-table')).toHaveCount(0);

  await page.getByRole('button', { name: 'Add target' }).click();
  await page.getByLabel('Target 1 name').fill('Cold patch, south');
  await page.getByLabel('Target 1 frame').selectOption('gal');
  await page.getByLabel('Target 1 l (°)').fill('230.5');
  // a target outside the sky: the message names the on-screen label and the range; what was typed stays
  await page.getByLabel('Target 1 b (°)').fill('-91');
  await expect(page.getByTestId('target-fields')).toContainText('"Target 1 b (°)" must be between -90 and 90, got -91');
  await expect(page.getByLabel('Target 1 name')).toHaveValue('Cold patch, south');
  await expect(page.getByLabel('Target 1 l (°)')).toHaveValue('230.5');
  await page.getByLabel('Target 1 b (°)').fill('21.9');
  await expect(page.getByTestId('target-fields')).not.toContainText('must be');

  // the run with the target
  await expect(page.getByTestId('targets-table')).toBeVisible({ timeout: 60_000 });
  await waitForMap(page);
  const rows = page.locator('[data-testid^="target-result-0-"]');
  await expect(rows).toHaveCount(SHORT.telescope.frequencies_mhz.length);
  await expect(rows.first()).toHaveAttribute('data-name', 'Cold patch, south');
  await expect(page.getByTestId('targets-table')).toContainText('Cold patch, south');
  // placed where the zenith passes in usable time: it spends time in the half-power beam
  expect(Number(await rows.first().getAttribute('data-hours'))).toBeGreaterThan(0);

  const [dl] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download targets CSV' }).click()]);
  expect(dl.suggestedFilename()).toMatch(/-targets\.csv$/);
  const csv = readFileSync(await dl.path(), 'utf8');
  const lines = csv.trim().split('\n');
  expect(lines[0]).toBe('name,ra_deg,dec_deg,l_deg,b_deg,frequency_mhz,usable_hours_in_beam_h,exposure_h,t_ant_mean_k,noise_k');
  expect(lines.length).toBe(1 + SHORT.telescope.frequencies_mhz.length);
  for (let k = 0; k < SHORT.telescope.frequencies_mhz.length; k++) {
    const cells = lines[1 + k].match(/^"Cold patch, south",([^,]*),([^,]*),230\.5,21\.9,([^,]*),([^,]*),([^,]*),/);
    expect(cells, lines[1 + k]).not.toBeNull();
    const row = rows.nth(k);
    expect(Number(cells![3])).toBe(Number(await row.getAttribute('data-mhz')));
    expect(Number(cells![4])).toBe(Number(await row.getAttribute('data-hours')));
    expect(Number(cells![5])).toBe(Number(await row.getAttribute('data-exposure')));
  }
  // the CLI writes the same bytes for the same scenario
  const scenario: Scenario = { ...SHORT, targets: [{ name: 'Cold patch, south', l_deg: 230.5, b_deg: 21.9 }] };
  expect(csv).toBe(cliTargetsCsv(scenario));
});

import { test, expect } from '@playwright/test';
import { SHORT, urlFor, guardHosts, waitForMap } from './helpers';
import { encodeScenarioParam } from '../../src/core/scenario';

// Issue 9 item 1: nothing the user had is lost. A damaged link opens the saved
// scenario and changes nothing stored; a valid link keeps the scenario it
// replaces one click away and on the header's Recent list.

let outside: string[] = [];
test.beforeEach(async ({ context }) => {
  outside = await guardHosts(context);
});
test.afterEach(() => {
  expect(outside, 'requests to other hosts').toEqual([]);
});

async function savedName(page: import('@playwright/test').Page): Promise<string | null> {
  return page.evaluate(() => {
    const t = window.localStorage.getItem('swathe.scenario/1');
    return t ? (JSON.parse(t) as { name: string }).name : null;
  });
}

test('save a scenario, open a damaged link, open the plain app: the saved scenario is there', async ({ page }) => {
  await page.goto(urlFor(SHORT));
  await waitForMap(page);
  await page.getByLabel('Scenario name').fill('My saved plan');
  await expect.poll(() => savedName(page)).toBe('My saved plan');

  const link = encodeScenarioParam({ ...SHORT, name: 'Plan from a colleague' });
  await page.goto(`./?s=${link.slice(0, Math.floor(link.length * 0.6))}`);
  await expect(page.getByTestId('notices')).toContainText(/link could not be opened.*cut short/i);
  await expect(page.getByTestId('notices')).toContainText('Your saved scenario is shown, unchanged.');
  await expect(page.getByLabel('Scenario name')).toHaveValue('My saved plan');
  await waitForMap(page);
  await page.waitForTimeout(800); // past the save debounce: nothing may overwrite the saved scenario
  expect(await savedName(page)).toBe('My saved plan');

  await page.goto('./');
  await expect(page.getByLabel('Scenario name')).toHaveValue('My saved plan');
  await expect(page.getByTestId('result-title')).toContainText('My saved plan', { timeout: 60_000 });
});

test('a valid link keeps the replaced scenario: one click back, and the Recent list', async ({ page }) => {
  await page.goto(urlFor(SHORT));
  await waitForMap(page);
  await page.getByLabel('Scenario name').fill('My saved plan');
  await expect.poll(() => savedName(page)).toBe('My saved plan');

  await page.goto(urlFor({ ...SHORT, name: 'Plan from a colleague', site: { body: 'moon', lat_deg: 10, lon_deg: 20 } }));
  await expect(page.getByLabel('Scenario name')).toHaveValue('Plan from a colleague');
  await expect(page.getByTestId('undo-notice')).toContainText('"My saved plan" is kept under Recent');
  await expect.poll(() => savedName(page)).toBe('Plan from a colleague');

  // the Recent list in the header has it, with a time
  await page.getByRole('button', { name: /^Recent \(1\)/ }).click();
  const list = page.getByRole('region', { name: 'Recent scenarios' });
  await expect(list).toContainText('My saved plan');
  await expect(list).toContainText(/set aside .*\d{1,2}:\d{2}/);
  await page.keyboard.press('Escape');

  // one click back; the link's scenario is set aside in turn
  await page.getByRole('button', { name: 'Go back to “My saved plan”' }).click();
  await expect(page.getByLabel('Scenario name')).toHaveValue('My saved plan');
  await expect(page.getByTestId('result-title')).toContainText('My saved plan', { timeout: 60_000 });
  await expect.poll(() => savedName(page)).toBe('My saved plan');
  await page.getByRole('button', { name: /^Recent \(2\)/ }).click();
  await expect(page.getByRole('region', { name: 'Recent scenarios' }).getByRole('button').first()).toContainText('Plan from a colleague');
});

import { test, expect } from '@playwright/test';
import { SHORT, urlFor, guardHosts, waitForMap, MAP } from './helpers';

// Phone width (issue 9 item 7): at 420 px the scenario form is one tap away
// (section tabs), not below the map and the globe; a table that scrolls
// sideways says so; the run bar is compact. Wide screens keep everything at once.

let outside: string[] = [];
test.beforeEach(async ({ context }) => {
  outside = await guardHosts(context);
});
test.afterEach(() => {
  expect(outside, 'requests to other hosts').toEqual([]);
});

test('at 420 px the form is reachable without scrolling past the figures, tables show a sideways cue, the run bar is compact', async ({ page }) => {
  await page.setViewportSize({ width: 420, height: 860 });
  await page.goto(urlFor(SHORT));
  await waitForMap(page);
  const tabs = page.getByRole('tablist', { name: 'Sections of the page' });
  await expect(tabs).toBeVisible();
  // Opens on the figures; the form is hidden, not pushed down the page.
  await expect(page.locator(MAP)).toBeVisible();
  await expect(page.getByLabel('Latitude', { exact: true })).toBeHidden();

  // One tap: the form's first fields are on the first screen, and the figures are out of the way.
  await page.getByRole('tab', { name: /Scenario/ }).click();
  await expect(page.getByRole('tab', { name: /Scenario/ })).toHaveAttribute('aria-selected', 'true');
  const lat = page.getByLabel('Latitude', { exact: true });
  await expect(lat).toBeVisible();
  const box = (await lat.boundingBox())!;
  expect(box.y + box.height).toBeLessThan(860);
  await expect(page.locator(MAP)).toBeHidden();
  await expect(page.locator('.globe-col')).toBeHidden();
  // An edit there recomputes; the run bar stays in view and is compact (one or two short lines).
  await lat.fill('-30');
  const bar = page.getByTestId('runbar');
  await expect(bar).toBeVisible();
  expect((await bar.boundingBox())!.height).toBeLessThan(80);
  await expect(bar.getByText('Auto-update')).toBeVisible();
  await expect(bar.getByText('Update automatically')).toBeHidden();

  // Results: the table scrolls sideways with a visible cue, which goes once scrolled to the end.
  await page.getByRole('tab', { name: 'Results' }).click();
  await waitForMap(page);
  const cue = page.getByTestId('results-scroll');
  await expect(cue).toBeVisible();
  await expect(cue).toHaveAttribute('data-more-right', '1');
  await expect(page.getByTestId('results-scroll-hint')).toContainText('scroll sideways');
  await cue.locator('.table-wrap').evaluate((el) => { el.scrollLeft = el.scrollWidth; });
  await expect(cue).toHaveAttribute('data-more-right', '0');
  await expect(page.getByTestId('results-scroll-hint')).toContainText('More columns to the left');
  await expect(page.getByTestId('timeline-canvas')).toBeVisible();
  await expect(page.locator(MAP)).toBeHidden();

  // Back to the map: drawn for the new latitude.
  await page.getByRole('tab', { name: 'Map & globe' }).click();
  await expect(page.getByTestId('result-title')).toContainText('30.00° S');
  await expect(page.locator(MAP)).toBeVisible();
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
  expect(overflow).toBeLessThanOrEqual(1);
  // The keyboard moves between the tabs too.
  await page.getByRole('tab', { name: 'Map & globe' }).focus();
  await page.keyboard.press('ArrowLeft');
  await expect(page.getByRole('tab', { name: /Scenario/ })).toHaveAttribute('aria-selected', 'true');
  await expect(page.getByRole('tab', { name: /Scenario/ })).toBeFocused();
  await expect(page.getByLabel('Latitude', { exact: true })).toBeVisible();
});

test('at 1440 px there are no tabs: form, map and results show together, with the full run bar', async ({ page }) => {
  await page.goto(urlFor(SHORT));
  await waitForMap(page);
  await expect(page.getByRole('tablist', { name: 'Sections of the page' })).toBeHidden();
  await expect(page.getByLabel('Latitude', { exact: true })).toBeVisible();
  await expect(page.locator(MAP)).toBeVisible();
  await expect(page.getByTestId('runbar').getByText('Update automatically')).toBeVisible();
  await expect(page.getByTestId('results-scroll')).toHaveAttribute('data-more-right', '0');
  await expect(page.getByTestId('results-scroll-hint')).toHaveCount(0);
});

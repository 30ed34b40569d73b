import { test, expect, type Page } from '@playwright/test';
import { readFileSync } from 'node:fs';
import { SHORT, urlFor, guardHosts, waitForMap } from './helpers';

// The timeline zooms (drag, wheel, buttons, reset) and reads out the time, the
// zenith's galactic latitude, the usable flag and the Sun and Earth elevations
// under the pointer: checked against the same moment's row of track.csv (issue 9 item 5).

let outside: string[] = [];
test.beforeEach(async ({ context }) => {
  outside = await guardHosts(context);
});
test.afterEach(() => {
  expect(outside, 'requests to other hosts').toEqual([]);
});

const CANVAS = '[data-testid="timeline-canvas"]';
async function range(page: Page): Promise<[number, number]> {
  const c = page.locator(CANVAS);
  return [Number(await c.getAttribute('data-range-start')), Number(await c.getAttribute('data-range-end'))];
}
const signed = (v: number) => `${v >= 0 ? '+' : '−'}${Math.abs(v).toFixed(1)}°`;

test('the timeline zooms by drag and wheel, resets, and reads out the values of track.csv under the pointer', async ({ page }) => {
  await page.goto(urlFor(SHORT));
  await waitForMap(page);
  const [dl] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download track CSV', exact: true }).click()]);
  const lines = readFileSync(await dl.path(), 'utf8').trimEnd().split(/\r?\n/).filter((l) => !l.startsWith('#'));
  const head = lines[0].split(',');
  const rows = lines.slice(1).map((l) => l.split(','));
  const col = (name: string) => head.indexOf(name);
  const canvas = page.locator(CANVAS);
  await canvas.scrollIntoViewIfNeeded();
  const [s0, e0] = await range(page);
  const box = (await canvas.boundingBox())!;
  const plotL = 52, plotR = box.width - 12;
  const xAt = (frac: number) => plotL + frac * (plotR - plotL);

  // Drag from 25 % to 50 % of the span: the visible range becomes that quarter.
  await page.mouse.move(box.x + xAt(0.25), box.y + 100);
  await page.mouse.down();
  await page.mouse.move(box.x + xAt(0.4), box.y + 100, { steps: 4 });
  await page.mouse.move(box.x + xAt(0.5), box.y + 100, { steps: 4 });
  await page.mouse.up();
  await expect.poll(async () => (await range(page))[1] - (await range(page))[0]).toBeLessThan((e0 - s0) * 0.3);
  const [s1, e1] = await range(page);
  expect(Math.abs(s1 - (s0 + 0.25 * (e0 - s0)))).toBeLessThan((e0 - s0) * 0.01);
  expect(Math.abs(e1 - (s0 + 0.5 * (e0 - s0)))).toBeLessThan((e0 - s0) * 0.01);
  await expect(page.getByTestId('timeline-range')).toContainText('Showing');

  // The wheel zooms in further about the pointer.
  await page.mouse.move(box.x + xAt(0.5), box.y + 100);
  await page.mouse.wheel(0, -300);
  await expect.poll(async () => (await range(page))[1] - (await range(page))[0]).toBeLessThan(e1 - s1);

  // Readout under the pointer: the row of track.csv at the same minute.
  await page.mouse.move(box.x + xAt(0.37), box.y + 120);
  const readout = page.getByTestId('timeline-readout');
  await expect(readout).toContainText('Zenith b');
  const text = await readout.innerText();
  const time = /(\d{4}-\d\d-\d\d \d\d:\d\d) UTC/.exec(text)![1];
  const row = rows.find((r) => r[col('utc')].slice(0, 16).replace('T', ' ') === time);
  expect(row, `a track.csv row at ${time}`).toBeDefined();
  expect(text).toContain(`Zenith b ${signed(Number(row![col('b_deg')]))}`);
  expect(text).toContain(`Usable ${row![col('usable')] === '1' ? 'yes' : 'no'}`);
  expect(text).toContain(`Sun elevation ${signed(Number(row![col('sun_elev_deg')]))}`);
  expect(text).toContain(`Earth elevation ${signed(Number(row![col('earth_elev_deg')]))}`);

  // Reset shows the whole span again; so does a double-click after another zoom.
  await page.getByRole('button', { name: 'Reset zoom' }).first().click();
  await expect.poll(() => range(page)).toEqual([s0, e0]);
  await page.getByRole('button', { name: 'Zoom in' }).first().click();
  await expect.poll(async () => (await range(page))[1] - (await range(page))[0]).toBeLessThan(e0 - s0);
  await canvas.dblclick({ position: { x: xAt(0.5), y: 100 } });
  await expect.poll(() => range(page)).toEqual([s0, e0]);
  await expect(page.getByTestId('timeline-range')).toContainText('Whole span');
});

import { expect, type Page, type Route, type BrowserContext } from '@playwright/test';
import { DEMO_SCENARIO } from '../../src/core/demo';
import { encodeScenarioParam } from '../../src/core/scenario';
import type { Scenario } from '../../src/core/types';

// Shared pieces of the browser tests: a short scenario (fast to compute) in
// the URL, waiting for a drawn map, reading canvas pixels, and a guard that
// fails a test on any request to a host other than the local preview server.

/** One synodic month at nside 64 and two frequencies: computes in well under a second. */
export const SHORT: Scenario = {
  ...DEMO_SCENARIO,
  name: 'Short test span',
  span: { start: '2031-03-01T00:00:00Z', end: '2031-03-30T12:44:00Z', step_min: null },
  telescope: { ...DEMO_SCENARIO.telescope, frequencies_mhz: [8, 16] },
  map: { ...DEMO_SCENARIO.map, nside: 64 },
};

export function urlFor(s: Scenario): string {
  return `./?s=${encodeScenarioParam(s)}`;
}

/** Records and blocks every request whose host is not this machine's preview server. */
export async function guardHosts(context: BrowserContext): Promise<string[]> {
  const outside: string[] = [];
  await context.route('**/*', (route: Route) => {
    const u = new URL(route.request().url());
    const local = u.protocol === 'data:' || u.protocol === 'blob:' || u.hostname === '127.0.0.1' || u.hostname === 'localhost';
    if (local) return route.continue();
    outside.push(route.request().url());
    return route.abort();
  });
  return outside;
}

export const MAP = '[data-testid="sky-map-canvas"]';

export async function drawCount(page: Page): Promise<number> {
  const v = await page.locator(MAP).first().getAttribute('data-draw-count');
  return Number(v ?? 0);
}

/** Waits until a map has been drawn at least `min` times and no run is in progress. */
export async function waitForMap(page: Page, min = 1): Promise<void> {
  await expect.poll(() => drawCount(page), { timeout: 60_000 }).toBeGreaterThanOrEqual(min);
  await expect(page.getByTestId('runbar')).toHaveAttribute('data-running', '0', { timeout: 60_000 });
}

/** A 32-bit FNV-1a hash of the canvas pixels (changes whenever the drawing does). */
export async function mapHash(page: Page): Promise<string> {
  return page.locator(MAP).first().evaluate((el) => {
    const c = el as HTMLCanvasElement;
    const d = c.getContext('2d')!.getImageData(0, 0, c.width, c.height).data;
    let h = 0x811c9dc5;
    for (let i = 0; i < d.length; i += 1) {
      h ^= d[i];
      h = Math.imul(h, 0x01000193) >>> 0;
    }
    return `${c.width}x${c.height}:${h.toString(16)}`;
  });
}

import { describe, expect, it } from 'vitest';
import { loadStartup, STORAGE_KEY, URL_PARAM } from '../../src/ui/state/persist';
import { RECENT_KEY, RECENT_MAX, readRecent, rememberScenario, type KeyValueStore } from '../../src/ui/state/recent';
import { encodeScenarioParam, scenarioToJson } from '../../src/core/scenario';
import { DEMO_SCENARIO } from '../../src/core/demo';
import type { Scenario } from '../../src/core/types';

// Issue 9 item 1: nothing the user had is lost. A damaged link leaves the saved
// scenario alone; a valid link sets it aside on the recent list first.

class MemStore implements KeyValueStore {
  readonly m = new Map<string, string>();
  quota = Infinity;
  getItem(k: string) { return this.m.has(k) ? this.m.get(k)! : null; }
  setItem(k: string, v: string) {
    let size = v.length;
    for (const [key, val] of this.m) if (key !== k) size += val.length;
    if (size > this.quota) throw new Error('QuotaExceededError');
    this.m.set(k, v);
  }
}

const MINE: Scenario = { ...DEMO_SCENARIO, name: 'My saved plan', site: { body: 'moon', lat_deg: -41.5, lon_deg: 163 } };
const LINKED: Scenario = { ...DEMO_SCENARIO, name: 'Plan from a colleague', site: { body: 'moon', lat_deg: 12, lon_deg: -170 } };

function withSaved(s: Scenario): MemStore {
  const st = new MemStore();
  st.setItem(STORAGE_KEY, scenarioToJson(s));
  return st;
}

describe('startup from a link', () => {
  it('a link cut short opens the saved scenario, leaves storage untouched and says what was wrong', () => {
    const st = withSaved(MINE);
    const before = new Map(st.m);
    const good = encodeScenarioParam(LINKED);
    const r = loadStartup({ search: `?${URL_PARAM}=${good.slice(0, Math.floor(good.length / 2))}` }, st);
    expect(r.scenario).toEqual(MINE);
    expect(r.source).toBe('storage');
    expect(r.replaced).toBeNull();
    expect(r.notice).toMatch(/link could not be opened/i);
    expect(r.notice).toMatch(/cut short|damaged/);
    expect(r.notice).toMatch(/saved scenario is shown/);
    expect(st.m).toEqual(before);
  });

  it('a link that is not base64url, or decodes to an invalid scenario, is refused the same way', () => {
    for (const bad of ['%%%not-a-link', encodeScenarioParam({ ...LINKED, site: { ...LINKED.site, lat_deg: 95 } })]) {
      const st = withSaved(MINE);
      const r = loadStartup({ search: `?${URL_PARAM}=${bad}` }, st);
      expect(r.scenario).toEqual(MINE);
      expect(r.notice).toMatch(/link could not be opened/i);
      expect(st.getItem(STORAGE_KEY)).toBe(scenarioToJson(MINE));
    }
  });

  it('a damaged link with nothing saved opens the demo and says so', () => {
    const r = loadStartup({ search: `?${URL_PARAM}=abc` }, new MemStore());
    expect(r.scenario).toEqual(DEMO_SCENARIO);
    expect(r.notice).toMatch(/no saved scenario, so the demo is shown/);
  });

  it('a valid link opens its scenario and puts the saved one on the recent list', () => {
    const st = withSaved(MINE);
    const r = loadStartup({ search: `?${URL_PARAM}=${encodeScenarioParam(LINKED)}` }, st);
    expect(r.scenario).toEqual(LINKED);
    expect(r.replaced).toEqual(MINE);
    const list = readRecent(st);
    expect(list.map((e) => e.name)).toEqual(['My saved plan']);
    expect(list[0].scenario).toEqual(MINE);
  });

  it('a link to the saved scenario itself replaces nothing', () => {
    const st = withSaved(MINE);
    const r = loadStartup({ search: `?${URL_PARAM}=${encodeScenarioParam(MINE)}` }, st);
    expect(r.replaced).toBeNull();
    expect(readRecent(st)).toEqual([]);
  });

  it('corrupt storage and no link still fall back to the demo with a notice (as before)', () => {
    const st = new MemStore();
    st.setItem(STORAGE_KEY, '{"format":');
    const r = loadStartup({ search: '' }, st);
    expect(r.scenario).toEqual(DEMO_SCENARIO);
    expect(r.notice).toMatch(/saved scenario could not be read/);
    expect(loadStartup({ search: '' }, null).notice).toMatch(/Local storage is not available/);
  });
});

describe('recent scenarios', () => {
  const nth = (i: number): Scenario => ({ ...DEMO_SCENARIO, name: `Plan ${i}` });

  it('keeps the last ten, newest first, one entry per scenario, with the time', () => {
    const st = new MemStore();
    for (let i = 0; i < 14; i++) rememberScenario(st, nth(i), new Date(Date.UTC(2031, 0, 1, i)));
    rememberScenario(st, nth(9), new Date(Date.UTC(2031, 0, 2)));
    const list = readRecent(st);
    expect(list).toHaveLength(RECENT_MAX);
    expect(list.map((e) => e.name)).toEqual(['Plan 9', 'Plan 13', 'Plan 12', 'Plan 11', 'Plan 10', 'Plan 8', 'Plan 7', 'Plan 6', 'Plan 5', 'Plan 4']);
    expect(list[0].saved_at).toBe('2031-01-02T00:00:00.000Z');
  });

  it('a full storage drops the oldest entries rather than failing; nothing writable gives null', () => {
    const st = new MemStore();
    for (let i = 0; i < 5; i++) rememberScenario(st, nth(i));
    st.quota = st.getItem(RECENT_KEY)!.length; // room for about five entries
    const list = rememberScenario(st, nth(99));
    expect(list).not.toBeNull();
    expect(list![0].name).toBe('Plan 99');
    expect(list!.length).toBeLessThan(6);
    st.quota = 10;
    expect(rememberScenario(st, nth(100))).toBeNull();
  });

  it('a corrupt list reads as empty and bad entries are skipped', () => {
    const st = new MemStore();
    st.setItem(RECENT_KEY, 'not json');
    expect(readRecent(st)).toEqual([]);
    st.setItem(RECENT_KEY, JSON.stringify({ items: [{ saved_at: 'x', scenario: MINE }, { saved_at: '2031-01-01T00:00:00Z', scenario: { nope: 1 } }, { saved_at: '2031-01-01T00:00:00Z', scenario: MINE }] }));
    expect(readRecent(st).map((e) => e.name)).toEqual(['My saved plan']);
  });
});

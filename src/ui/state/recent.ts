import type { Scenario } from '../../core/types';
import { parseScenario, scenarioToJson } from '../../core/scenario';

// The browser's list of recent scenarios: whenever a scenario is replaced as a
// whole (a link opened, a file imported, a recent one reopened) the one it
// replaces goes here, so no click ever loses work. Newest first, at most
// RECENT_MAX, one entry per distinct scenario. Pure apart from the store passed in.

export const RECENT_KEY = 'swathe.recent/1';
export const RECENT_MAX = 10;

/** The part of the Web Storage API used here (tests pass a Map-backed one). */
export interface KeyValueStore {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
}

export interface RecentEntry {
  name: string;
  /** when it was set aside (ISO 8601 UTC) */
  saved_at: string;
  scenario: Scenario;
}

/** Reads the list; anything unreadable (corrupt, foreign, storage off) reads as empty, entry by entry. */
export function readRecent(store: KeyValueStore | null): RecentEntry[] {
  if (!store) return [];
  let text: string | null;
  try {
    text = store.getItem(RECENT_KEY);
  } catch {
    return [];
  }
  if (!text) return [];
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch {
    return [];
  }
  const items = (value as { items?: unknown })?.items;
  if (!Array.isArray(items)) return [];
  const out: RecentEntry[] = [];
  for (const it of items) {
    if (!it || typeof it !== 'object') continue;
    const e = it as Record<string, unknown>;
    const r = parseScenario(e.scenario);
    if (!r.ok || typeof e.saved_at !== 'string' || Number.isNaN(Date.parse(e.saved_at))) continue;
    out.push({ name: r.scenario.name, saved_at: e.saved_at, scenario: r.scenario });
    if (out.length === RECENT_MAX) break;
  }
  return out;
}

/**
 * Puts `s` at the top of the list (dropping an older copy of the same
 * scenario) and writes it back. When the store is full, older entries are
 * dropped until it fits. Returns the new list, or null when nothing could be
 * written (storage full or disabled).
 */
export function rememberScenario(store: KeyValueStore | null, s: Scenario, now: Date = new Date()): RecentEntry[] | null {
  if (!store) return null;
  const key = scenarioToJson(s);
  const list = [
    { name: s.name, saved_at: now.toISOString(), scenario: s },
    ...readRecent(store).filter((e) => scenarioToJson(e.scenario) !== key),
  ].slice(0, RECENT_MAX);
  for (let n = list.length; n >= 1; n--) {
    try {
      store.setItem(RECENT_KEY, JSON.stringify({ format: RECENT_KEY, items: list.slice(0, n) }));
      return list.slice(0, n);
    } catch {
      // full: try again with fewer entries
    }
  }
  return null;
}

/** "3 Mar 2031, 14:05" in the user's time zone (the list is for people, the stored value is UTC). */
export function recentTimeLabel(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return d.toLocaleString(undefined, { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' });
}

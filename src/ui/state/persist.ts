import type { Scenario } from '../../core/types';
import { DEMO_SCENARIO } from '../../core/demo';
import { decodeScenarioParam, encodeScenarioParam, parseScenarioJson, scenarioToJson } from '../../core/scenario';
import { rememberScenario, type KeyValueStore } from './recent';

// Where the app's scenario lives between visits: the URL (?s=..., shareable)
// wins, then local storage, then the embedded demo. Nothing here throws, and
// nothing here loses the saved scenario: a damaged link leaves it alone, a
// valid link first puts it on the recent list (recent.ts).

export const STORAGE_KEY = 'swathe.scenario/1';
export const URL_PARAM = 's';

export interface Startup {
  scenario: Scenario;
  source: 'url' | 'storage' | 'demo';
  notice: string | null;
  /** The saved scenario a valid link replaced (also put on the recent list), for a one-click way back. */
  replaced: Scenario | null;
}

function issuesText(issues: { field: string; message: string }[]): string {
  const shown = issues.slice(0, 3).map((i) => i.message.replace(/^\(url\): /, ''));
  return shown.join(' ') + (issues.length > 3 ? ` (and ${issues.length - 3} more)` : '');
}

/** The browser's local storage, or null where it is disabled (reading the property can throw). */
export function browserStore(): KeyValueStore | null {
  try {
    return window.localStorage;
  } catch {
    return null;
  }
}

type Stored = { ok: true; scenario: Scenario } | { ok: false; why: 'none' | 'unavailable' | 'unreadable'; detail: string };

function readStored(store: KeyValueStore | null): Stored {
  if (!store) return { ok: false, why: 'unavailable', detail: '' };
  let text: string | null;
  try {
    text = store.getItem(STORAGE_KEY);
  } catch {
    return { ok: false, why: 'unavailable', detail: '' };
  }
  if (text === null) return { ok: false, why: 'none', detail: '' };
  try {
    const r = parseScenarioJson(text, 'saved scenario');
    return r.ok ? { ok: true, scenario: r.scenario } : { ok: false, why: 'unreadable', detail: issuesText(r.issues) };
  } catch (e) {
    return { ok: false, why: 'unreadable', detail: `(${String(e)})` };
  }
}

/**
 * What the app opens with. A link (?s=...) that decodes wins, and the saved
 * scenario it replaces goes on the recent list first. A link that does not
 * decode changes nothing stored: the saved scenario opens (the demo when there
 * is none) with a notice saying what was wrong with the link.
 */
export function loadStartup(loc: { search: string } = window.location, store: KeyValueStore | null = browserStore()): Startup {
  let param: string | null = null;
  try {
    param = new URLSearchParams(loc.search).get(URL_PARAM);
  } catch {
    param = null;
  }
  let linkProblem: string | null = null;
  if (param !== null) {
    let r: ReturnType<typeof decodeScenarioParam>;
    try {
      r = decodeScenarioParam(param);
    } catch (e) {
      r = { ok: false, issues: [{ field: '(url)', message: String(e) }] };
    }
    if (r.ok) {
      const stored = readStored(store);
      let replaced: Scenario | null = null;
      if (stored.ok && scenarioToJson(stored.scenario) !== scenarioToJson(r.scenario)) {
        replaced = stored.scenario;
        rememberScenario(store, stored.scenario);
      }
      return { scenario: r.scenario, source: 'url', notice: null, replaced };
    }
    linkProblem = `The link could not be opened: ${issuesText(r.issues)}`;
  }
  const stored = readStored(store);
  const join = (a: string | null, b: string) => (a ? `${/[.!?]$/.test(a) ? a : a + '.'} ${b}` : b);
  if (stored.ok) {
    return { scenario: stored.scenario, source: 'storage', replaced: null,
      notice: linkProblem ? join(linkProblem, 'Your saved scenario is shown, unchanged.') : null };
  }
  if (stored.why === 'none') {
    return { scenario: DEMO_SCENARIO, source: 'demo', replaced: null,
      notice: linkProblem ? join(linkProblem, 'There is no saved scenario, so the demo is shown.') : null };
  }
  if (stored.why === 'unavailable') {
    return { scenario: DEMO_SCENARIO, source: 'demo', replaced: null,
      notice: join(linkProblem, 'Local storage is not available, so the last scenario could not be restored; the demo is shown.') };
  }
  return { scenario: DEMO_SCENARIO, source: 'demo', replaced: null,
    notice: join(linkProblem, `The saved scenario could not be read, so the demo is shown. ${stored.detail}`.trim()) };
}

/** Saves to local storage and the URL; returns a notice when storage refused (full, disabled). */
export function saveScenario(s: Scenario): string | null {
  let notice: string | null = null;
  try {
    const param = encodeScenarioParam(s);
    const url = new URL(window.location.href);
    url.searchParams.set(URL_PARAM, param);
    window.history.replaceState(null, '', url.toString());
  } catch (e) {
    notice = `The link could not be updated (${String(e)}).`;
  }
  try {
    window.localStorage.setItem(STORAGE_KEY, scenarioToJson(s));
  } catch {
    notice = 'The scenario could not be saved in local storage (full or disabled); the link in the address bar still holds it.';
  }
  return notice;
}

export function shareLink(s: Scenario): string {
  const url = new URL(window.location.href);
  url.search = '';
  url.searchParams.set(URL_PARAM, encodeScenarioParam(s));
  return url.toString();
}

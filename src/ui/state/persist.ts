import type { Scenario } from '../../core/types';
import { DEMO_SCENARIO } from '../../core/demo';
import { decodeScenarioParam, encodeScenarioParam, parseScenarioJson, scenarioToJson } from '../../core/scenario';

// Where the app's scenario lives between visits: the URL (?s=..., shareable)
// wins, then local storage, then the embedded demo. Anything unreadable falls
// back to the demo with a notice; nothing here throws.

export const STORAGE_KEY = 'swathe.scenario/1';
export const URL_PARAM = 's';

export interface Startup {
  scenario: Scenario;
  source: 'url' | 'storage' | 'demo';
  notice: string | null;
}

function issuesText(issues: { field: string; message: string }[]): string {
  const shown = issues.slice(0, 3).map((i) => i.message);
  return shown.join(' ') + (issues.length > 3 ? ` (and ${issues.length - 3} more)` : '');
}

export function loadStartup(loc: { search: string } = window.location): Startup {
  let param: string | null = null;
  try {
    param = new URLSearchParams(loc.search).get(URL_PARAM);
  } catch {
    param = null;
  }
  if (param !== null) {
    try {
      const r = decodeScenarioParam(param);
      if (r.ok) return { scenario: r.scenario, source: 'url', notice: null };
      return { scenario: DEMO_SCENARIO, source: 'demo', notice: `The scenario in the link could not be read, so the demo is shown. ${issuesText(r.issues)}` };
    } catch (e) {
      return { scenario: DEMO_SCENARIO, source: 'demo', notice: `The scenario in the link could not be read (${String(e)}), so the demo is shown.` };
    }
  }
  let stored: string | null = null;
  try {
    stored = window.localStorage.getItem(STORAGE_KEY);
  } catch {
    return { scenario: DEMO_SCENARIO, source: 'demo', notice: 'Local storage is not available, so the last scenario could not be restored; the demo is shown.' };
  }
  if (stored === null) return { scenario: DEMO_SCENARIO, source: 'demo', notice: null };
  try {
    const r = parseScenarioJson(stored, 'saved scenario');
    if (r.ok) return { scenario: r.scenario, source: 'storage', notice: null };
    return { scenario: DEMO_SCENARIO, source: 'demo', notice: `The saved scenario could not be read, so the demo is shown. ${issuesText(r.issues)}` };
  } catch (e) {
    return { scenario: DEMO_SCENARIO, source: 'demo', notice: `The saved scenario could not be read (${String(e)}), so the demo is shown.` };
  }
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

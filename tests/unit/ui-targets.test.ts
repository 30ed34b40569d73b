import { describe, expect, it } from 'vitest';
import { parseScenario } from '../../src/core/scenario';
import { DEMO_SCENARIO } from '../../src/core/demo';
import { draftToCandidate, scenarioToDraft, IssueIndex, newId, type Draft } from '../../src/ui/state/draft';
import { appIssues } from '../../src/ui/state/fieldLabels';
import { switchFrame } from '../../src/ui/panel/TargetFields';
import type { Scenario } from '../../src/core/types';

// The Targets section of the panel: a scenario's targets go through the draft
// unchanged, a bad value gives a message naming the on-screen label (the
// aria-labels written in panel/TargetFields.tsx, typed out here by hand) and
// the range, the typed text stays in the draft, and switching the frame keeps
// the direction.

const WITH: Scenario = { ...DEMO_SCENARIO, targets: [{ name: 'A', ra_deg: 150.25, dec_deg: -23.5 }, { name: 'B, inner', l_deg: 10, b_deg: -3 }] };

describe('targets in the panel', () => {
  it('scenario -> draft -> scenario keeps the targets as given', () => {
    const r = parseScenario(draftToCandidate(scenarioToDraft(WITH)));
    expect(r.ok && r.scenario.targets).toEqual(WITH.targets);
    // no rows: no targets key (old scenarios unchanged)
    const r0 = parseScenario(draftToCandidate(scenarioToDraft(DEMO_SCENARIO)));
    expect(r0.ok && r0.scenario.targets).toBeUndefined();
  });

  it('a target outside the sky names "Target N b (°)" and the range; the draft keeps what was typed', () => {
    const d0 = scenarioToDraft(WITH);
    const d: Draft = { ...d0, lat: '-20', targets: d0.targets!.map((t, i) => (i === 1 ? { ...t, b: '-91' } : t)) };
    const r = parseScenario(draftToCandidate(d));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const app = new IssueIndex(appIssues(r.issues));
    expect(app.get('targets.1').join(' ')).toBe('"Target 2 b (°)" must be between -90 and 90, got -91');
    expect(d.targets![1].b).toBe('-91');
    expect(d.lat).toBe('-20');
  });

  it.each([
    [{ name: '', sys: 'eq' as const, a: '10', b: '5' }, '"Target 1 name" is required (1 to 80 printable characters)'],
    [{ name: 'X', sys: 'eq' as const, a: '400', b: '5' }, '"Target 1 RA (°)" must be a number of degrees from 0 up to (not including) 360, got 400'],
    [{ name: 'X', sys: 'eq' as const, a: '10', b: '95' }, '"Target 1 Dec (°)" must be between -90 and 90, got 95'],
    [{ name: 'X', sys: 'gal' as const, a: 'abc', b: '5' }, '"Target 1 l (°)" must be a number of degrees from 0 up to (not including) 360, got "abc"'],
    [{ name: 'X', sys: 'gal' as const, a: '10', b: '' }, '"Target 1 b (°)" must be a number between -90 and 90, got an empty box'],
  ])('%o: %s', (row, want) => {
    const d: Draft = { ...scenarioToDraft(DEMO_SCENARIO), targets: [{ id: newId(), ...row }] };
    const r = parseScenario(draftToCandidate(d));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(new IssueIndex(appIssues(r.issues)).get('targets.0').join(' ')).toBe(want);
  });

  it('switching the frame converts a valid position (the galactic centre near RA 266.40, Dec -28.94) and back', () => {
    const row = { id: 1, name: 'GC', sys: 'gal' as const, a: '0', b: '0' };
    const eq = switchFrame(row, 'eq');
    expect(eq.sys).toBe('eq');
    expect(Math.abs(Number(eq.a) - 266.405)).toBeLessThan(0.01);
    expect(Math.abs(Number(eq.b) - -28.936)).toBeLessThan(0.01);
    const back = switchFrame({ ...row, ...eq }, 'gal');
    expect(Math.abs(((Number(back.a) + 180) % 360) - 180)).toBeLessThan(1e-5);
    expect(Math.abs(Number(back.b))).toBeLessThan(1e-5);
    // a value that is not a position stays as typed
    expect(switchFrame({ ...row, b: '95' }, 'eq')).toEqual({ sys: 'eq' });
  });
});

import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseScenario } from '../../src/core/scenario';
import { runPlan } from '../../src/engine/runPlan';

// The README's worked example of geometric against diffraction-limited hours
// must be what a plan of its scenario gives today (the figures in the table
// were written from `swathe plan` on that scenario), so it cannot drift.
describe('README shielding worked example', () => {
  it('its table holds the usable hours a plan of its scenario gives', async () => {
    const readme = readFileSync(new URL('../../README.md', import.meta.url), 'utf8');
    const at = readme.indexOf('**Worked example**');
    expect(at).toBeGreaterThan(0);
    const rest = readme.slice(at);
    const json = rest.slice(rest.indexOf('```json') + 7, rest.indexOf('```', rest.indexOf('```json') + 7));
    const parsed = parseScenario(JSON.parse(json));
    expect(parsed.ok).toBe(true);
    if (!parsed.ok) return;
    const rows = [...rest.matchAll(/^\| ([\d.]+) MHz \| ([\d,.]+) h \| ([\d,.]+) h \|$/gm)].map((m) => m.slice(1).map((v) => Number(v.replace(/,/g, ''))));
    expect(rows.length).toBe(parsed.scenario.telescope.frequencies_mhz.length);
    const r = await runPlan(parsed.scenario);
    rows.forEach(([mhz, usable, geometric], k) => {
      const f = r.summary.frequencies[k];
      expect(f.mhz).toBe(mhz);
      expect(f.usable_hours).toBeCloseTo(usable, 6);
      expect(f.usable_hours_geometric).toBeCloseTo(geometric, 6);
    });
  }, 60_000);
});

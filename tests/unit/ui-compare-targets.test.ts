import { describe, expect, it } from 'vitest';
import type { PlanResult, Target, TargetSummary } from '../../src/core/types';
import { DEMO_SCENARIO } from '../../src/core/demo';
import { pairTargets, separationDeg } from '../../src/ui/compare/targetPairs';
import { mapTargetMarks, legendEntries, type SkyView } from '../../src/ui/skymap/figure';

// The comparison's targets: plan A's and plan B's summary.targets matched by
// name and frequency (a figure missing where a plan lacks the target or the
// frequency), the angle a target moved between the plans, and the targets a
// difference map marks (both plans', each name once unless B moved it).

/** A target's summary with figures that say which plan, target and frequency they belong to. */
function summary(name: string, ra: number, dec: number, freqs: number[], plan: number): TargetSummary {
  return {
    name, ra_deg: ra, dec_deg: dec, l_deg: 0, b_deg: 0,
    frequencies: freqs.map((mhz) => ({ mhz, usable_hours_in_beam: plan * 1000 + mhz, exposure_h: plan * 100 + mhz / 10, t_ant_mean_k: plan * 1e4 + mhz, noise_k: Number.NaN })),
  };
}

function plan(freqs: number[], targets: [string, number, number][], which: number): PlanResult {
  const scenario = {
    ...DEMO_SCENARIO,
    telescope: { ...DEMO_SCENARIO.telescope, frequencies_mhz: freqs },
    targets: targets.map(([name, ra_deg, dec_deg]): Target => ({ name, ra_deg, dec_deg })),
  };
  return {
    scenario,
    maps: freqs.map(() => new Float32Array(12)),
    summary: { frequencies: freqs.map((f) => ({ frequency_mhz: f, usable_hours_beam_in_band: 1, sky_fraction_covered: 0.1 })), targets: targets.map(([n, ra, dec]) => summary(n, ra, dec, freqs, which)) },
  } as unknown as PlanResult;
}

/** Great-circle angle by the haversine formula (written out here; the module uses atan2 of cross and dot). */
function haversineDeg(ra1: number, dec1: number, ra2: number, dec2: number): number {
  const r = Math.PI / 180;
  const h = Math.sin(((dec2 - dec1) * r) / 2) ** 2 + Math.cos(dec1 * r) * Math.cos(dec2 * r) * Math.sin(((ra2 - ra1) * r) / 2) ** 2;
  return (2 * Math.asin(Math.sqrt(h))) / r;
}

describe('pairTargets', () => {
  const a = plan([8, 16], [['Cold patch', 150, -23.5], ['Only A', 10, 5]], 1);
  const b = plan([16, 32], [['Only B', 200, 40], ['Cold patch', 150, -22.5]], 2);
  const pairs = pairTargets(a, b);

  it("lists A's targets in A's order, then B's own; each with A's frequencies then B's new ones", () => {
    expect(pairs.map((p) => p.name)).toEqual(['Cold patch', 'Only A', 'Only B']);
    for (const p of pairs) expect(p.frequencies.map((f) => f.mhz)).toEqual([8, 16, 32]);
  });

  it("gives each plan's own figures where it has the target and the frequency, and null elsewhere", () => {
    const cold = pairs[0];
    // 8 MHz: only A computed it; 16 MHz: both; 32 MHz: only B
    expect(cold.frequencies[0].a?.usable_hours_in_beam).toBe(1008);
    expect(cold.frequencies[0].b).toBeNull();
    expect(cold.frequencies[1].a?.usable_hours_in_beam).toBe(1016);
    expect(cold.frequencies[1].b?.usable_hours_in_beam).toBe(2016);
    expect(cold.frequencies[1].b?.exposure_h).toBeCloseTo(201.6, 12);
    expect(cold.frequencies[2].a).toBeNull();
    expect(cold.frequencies[2].b?.t_ant_mean_k).toBe(20032);
    const onlyA = pairs[1];
    expect(onlyA.b).toBeNull();
    expect(onlyA.movedDeg).toBeNull();
    expect(onlyA.frequencies.map((f) => f.b)).toEqual([null, null, null]);
    expect(onlyA.frequencies[2].a).toBeNull(); // A has no 32 MHz
    const onlyB = pairs[2];
    expect(onlyB.a).toBeNull();
    expect(onlyB.frequencies[0].b).toBeNull(); // B has no 8 MHz
    expect(onlyB.frequencies[1].b?.usable_hours_in_beam).toBe(2016);
  });

  it('says how far a target moved between the plans (1° along a meridian here)', () => {
    expect(pairs[0].movedDeg).toBeCloseTo(1, 9);
    const same = pairTargets(a, plan([8], [['Cold patch', 150, -23.5]], 2));
    expect(same[0].movedDeg).toBe(0);
  });

  it('is empty when neither plan has targets', () => {
    expect(pairTargets(plan([8], [], 1), plan([8], [], 2))).toEqual([]);
  });

  it('separationDeg agrees with the haversine formula, also near 0 and 180 degrees', () => {
    const cases: [number, number, number, number][] = [[0, 0, 90, 0], [10, 20, 10, 20.5], [150.25, -23.5, 330.25, 23.5], [359.9, 89.9, 0.1, 89.95], [45, 10, 45.000001, 10]];
    for (const [r1, d1, r2, d2] of cases) expect(separationDeg(r1, d1, r2, d2)).toBeCloseTo(haversineDeg(r1, d1, r2, d2), 9);
    expect(separationDeg(0, 0, 90, 0)).toBeCloseTo(90, 12);
  });
});

describe('targets on a difference map', () => {
  const a = plan([8], [['Cold patch', 150, -23.5], ['Kept', 10, 5]], 1);
  const b = plan([8], [['Kept', 10, 5], ['New in B', 200, 40], ['Cold patch', 151, -23.5]], 2);
  const base: SkyView = { freqIndex: 0, frame: 'equatorial', scale: 'linear', flipLongitude: false, compare: false };
  const diff: SkyView = { ...base, diff: { other: b, labelA: 'A', labelB: 'B' } };

  it("marks A's targets, then B's new ones, and a moved one again at B's place named with B's letter", () => {
    expect(mapTargetMarks(a, diff).map((t) => t.name)).toEqual(['Cold patch', 'Kept', 'New in B', 'Cold patch (B)']);
    const legend = legendEntries(a, diff).find((e) => e.kind === 'target');
    expect(legend?.label).toContain('Targets (4,');
  });

  it("B's place is B's position: RA 200, Dec 40 as a J2000 unit vector", () => {
    const v = mapTargetMarks(a, diff)[2].vec;
    const r = Math.PI / 180;
    const want = [Math.cos(40 * r) * Math.cos(200 * r), Math.cos(40 * r) * Math.sin(200 * r), Math.sin(40 * r)];
    v.forEach((x, i) => expect(x).toBeCloseTo(want[i], 12));
  });

  it("without a difference map (or while comparing frequencies) only the plan's own targets", () => {
    expect(mapTargetMarks(a, base).map((t) => t.name)).toEqual(['Cold patch', 'Kept']);
    expect(mapTargetMarks(a, { ...diff, compare: true }).map((t) => t.name)).toEqual(['Cold patch', 'Kept']);
  });
});

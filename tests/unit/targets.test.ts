import { describe, expect, it } from 'vitest';
import { decodeScenarioParam, encodeScenarioParam, parseScenario, parseScenarioJson, scenarioToJson } from '../../src/core/scenario';
import { DEMO_SCENARIO } from '../../src/core/demo';
import { runPlan } from '../../src/engine/runPlan';
import { interpRingVec } from '../../src/core/sky/interpolate';
import { targetPosition } from '../../src/core/targets/position';
import { targetsCsv } from '../../src/core/export/csv';
import { summaryJson } from '../../src/core/export/summary';
import type { PlanResult, Scenario } from '../../src/core/types';

// The `targets` field and the per-target figures (issue 12 item 5). Outside
// references are in tests/reference/targets-astropy.test.ts; here: the
// validation messages, the agreement of a target's exposure with the exposure
// map at its position, a uniform sky (mean T_ant equals the Cane/Dulk + CMB
// brightness, the noise equals the radiometer equation), and targets.csv.

const clone = <T>(x: T): T => JSON.parse(JSON.stringify(x));
const base = (targets: unknown): Record<string, unknown> => ({ ...clone(DEMO_SCENARIO), targets });
const messages = (targets: unknown): string[] => {
  const r = parseScenario(base(targets));
  return r.ok ? [] : r.issues.map((i) => i.message);
};

describe('targets field', () => {
  it('is optional: a scenario without it reads as before and writes no targets key', () => {
    const r = parseScenario(clone(DEMO_SCENARIO));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.scenario.targets).toBeUndefined();
    expect(scenarioToJson(r.scenario)).not.toContain('targets');
  });

  it('keeps each target in the coordinates given, through JSON and the share link', () => {
    const targets = [{ name: 'Quiet patch', ra_deg: 150.25, dec_deg: -23.5 }, { name: 'Centre, inner', l_deg: 0, b_deg: 0 }];
    const r = parseScenario(base(targets));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.scenario.targets).toEqual(targets);
    const j = parseScenarioJson(scenarioToJson(r.scenario));
    expect(j.ok && j.scenario.targets).toEqual(targets);
    const u = decodeScenarioParam(encodeScenarioParam(r.scenario));
    expect(u.ok && u.scenario.targets).toEqual(targets);
  });

  it.each([
    ['dec 95', [{ name: 'A', ra_deg: 10, dec_deg: 95 }], /targets\[0\]\.dec_deg must be between -90 and 90, got 95/],
    ['b -91', [{ name: 'A', l_deg: 10, b_deg: -91 }], /targets\[0\]\.b_deg must be between -90 and 90, got -91/],
    ['ra 400', [{ name: 'A', ra_deg: 400, dec_deg: 0 }], /targets\[0\]\.ra_deg must be a number of degrees from 0 up to \(not including\) 360, got 400/],
    ['ra 360', [{ name: 'A', ra_deg: 360, dec_deg: 0 }], /targets\[0\]\.ra_deg must be a number of degrees from 0 up to \(not including\) 360, got 360/],
    ['l negative', [{ name: 'A', l_deg: -1, b_deg: 0 }], /targets\[0\]\.l_deg must be a number of degrees from 0 up to \(not including\) 360, got -1/],
    ['dec NaN', [{ name: 'A', ra_deg: 1, dec_deg: NaN }], /targets\[0\]\.dec_deg must be a number between -90 and 90, got NaN/],
    ['dec as text', [{ name: 'A', ra_deg: 1, dec_deg: '12,5' }], /targets\[0\]\.dec_deg must be a number between -90 and 90, got "12,5" \(use a point as the decimal separator\)/],
    ['missing name', [{ ra_deg: 1, dec_deg: 2 }], /targets\[0\]\.name is required \(1 to 80 printable characters\)/],
    ['empty name', [{ name: '  ', ra_deg: 1, dec_deg: 2 }], /targets\[0\]\.name must be 1 to 80 printable characters, got "  "/],
    ['name too long', [{ name: 'x'.repeat(81), ra_deg: 1, dec_deg: 2 }], /targets\[0\]\.name must be at most 80 characters, got 81/],
    ['name with a line break', [{ name: 'a\nb', ra_deg: 1, dec_deg: 2 }], /targets\[0\]\.name must be printable text/],
    ['duplicate names', [{ name: 'A', ra_deg: 1, dec_deg: 2 }, { name: 'B', ra_deg: 1, dec_deg: 2 }, { name: 'A', l_deg: 1, b_deg: 2 }], /targets\[2\]\.name repeats "A" \(already at targets\[0\]\)/],
    ['both pairs', [{ name: 'A', ra_deg: 1, dec_deg: 2, l_deg: 3, b_deg: 4 }], /targets\[0\] has both equatorial \(ra_deg, dec_deg\) and galactic \(l_deg, b_deg\) coordinates: give one pair/],
    ['no position', [{ name: 'A' }], /targets\[0\] needs a position: ra_deg and dec_deg \(J2000\) or l_deg and b_deg \(galactic\)/],
    ['half a pair', [{ name: 'A', ra_deg: 1 }], /targets\[0\]\.dec_deg is required \(a number between -90 and 90\)/],
    ['an unknown key', [{ name: 'A', ra_deg: 1, dec_deg: 2, epoch: 2000 }], /targets\[0\]\.epoch is not a known field \(known: name, ra_deg, dec_deg, l_deg, b_deg\)/],
    ['not a list', { name: 'A', ra_deg: 1, dec_deg: 2 }, /targets must be a list of up to 32 targets/],
    ['33 targets', Array.from({ length: 33 }, (_, i) => ({ name: `T${i}`, ra_deg: i, dec_deg: 0 })), /targets must have at most 32 targets, got 33/],
  ])('%s: names the field and the allowed range', (_what, targets, re) => {
    const m = messages(targets);
    expect(m.some((x) => re.test(x)), m.join(' | ')).toBe(true);
  });
});

// Cane (1979) as written by Dulk et al. (2001, A&A 365, 294, eq. 1), written out
// here, plus the CMB (Fixsen 2009): the uniform sky's brightness.
function caneDulkK(mhz: number): number {
  const tau = 5.0 * mhz ** -2.1;
  const I = 2.48e-20 * mhz ** -0.52 * ((1 - Math.exp(-tau)) / tau) + 1.06e-20 * mhz ** -0.80 * Math.exp(-tau);
  const nu = mhz * 1e6;
  return (I * 299_792_458 ** 2) / (2 * 1.380649e-23 * nu * nu) + 2.7255;
}

/** Targets spread over the demo site's sky (southern, near the zenith track at -23.5 deg) and beyond. */
const TARGETS = [
  { name: 'a', ra_deg: 30, dec_deg: -23.5 }, { name: 'b', ra_deg: 200, dec_deg: -20 }, { name: 'c', l_deg: 0, b_deg: 0 },
  { name: 'd', ra_deg: 120, dec_deg: -26 }, { name: 'e, east', ra_deg: 300, dec_deg: -22 }, { name: 'far north', ra_deg: 10, dec_deg: 80 },
];

function scenarioFor(variant: 'dish' | 'tilted fan' | 'dipole'): Scenario {
  const s = clone(DEMO_SCENARIO) as Scenario;
  s.span.end = '2031-06-01T00:00:00Z';
  s.sky = { model: 'uniform' };
  s.telescope.receiver_temp_k = 300;
  s.targets = TARGETS;
  if (variant === 'tilted fan') {
    delete s.telescope.aperture_m;
    s.telescope.frequencies_mhz = [4, 8];
    s.telescope.beam = { model: 'elliptical_gaussian', length_m: 400, width_m: 150, fwhm_factor: 1.15, axis_azimuth_deg: 20 };
    s.telescope.pointing = { elevation_deg: 80, azimuth_deg: 180 };
    s.telescope.feeds = [{ x_offset_deg: 3, y_offset_deg: 0 }];
  }
  if (variant === 'dipole') {
    delete s.telescope.aperture_m;
    s.telescope.frequencies_mhz = [4, 8];
    s.telescope.beam = { model: 'dipole', length_m: 15, height_m: 5, fwhm_factor: 1.15 };
    s.map.nside = 32;
  }
  return s;
}

/**
 * Runs the variant twice: the second time with more targets where the first
 * run's zenith was at three moments, and 10 degrees south of it (where the
 * tilted beam looks), so some targets pass through every beam.
 */
async function twoRuns(v: 'dish' | 'tilted fan' | 'dipole'): Promise<PlanResult> {
  const s = scenarioFor(v);
  const first = await runPlan(s);
  const t = first.track;
  const extra = [0.25, 0.5, 0.75].flatMap((q) => {
    const i = Math.floor(q * t.n);
    const ra = Number(t.ra_deg[i].toFixed(4)) % 360;
    return [{ name: `zenith ${q}`, ra_deg: ra, dec_deg: Number(t.dec_deg[i].toFixed(4)) }, { name: `south ${q}`, ra_deg: ra, dec_deg: Number((t.dec_deg[i] - 10).toFixed(4)) }];
  });
  return runPlan({ ...s, targets: [...TARGETS, ...extra] }, { reuse: first });
}
const runs = new Map<string, Promise<PlanResult>>();
const run = (v: 'dish' | 'tilted fan' | 'dipole') => {
  if (!runs.has(v)) runs.set(v, twoRuns(v));
  return runs.get(v)!;
};

describe.each(['dish', 'tilted fan', 'dipole'] as const)('target figures: %s', (variant) => {
  it('exposure at a target equals the exposure map interpolated there (within 2% where it is over 1% of the map maximum)', async () => {
    const r = await run(variant);
    const s = r.scenario;
    const pixRad = Math.sqrt((4 * Math.PI) / (12 * s.map.nside ** 2));
    let compared = 0, worst = 0;
    r.summary.targets!.forEach((t, j) => {
      const v = targetPosition(s.targets![j]).vec;
      t.frequencies.forEach((f, k) => {
        const fwhmRad = (r.summary.frequencies[k].beam!.fwhm_minor_deg * Math.PI) / 180;
        let max = 0;
        for (const x of r.maps[k]) max = Math.max(max, x);
        const m = interpRingVec(r.maps[k], s.map.nside, v[0], v[1], v[2]);
        // the map can be read between its pixels only where the beam spans several of them
        if (m > 0.01 * max && fwhmRad > 6 * pixRad) {
          compared++;
          worst = Math.max(worst, Math.abs(f.exposure_h / m - 1));
          expect(Math.abs(f.exposure_h / m - 1), `${t.name} at ${f.mhz} MHz: ${f.exposure_h} h vs map ${m} h`).toBeLessThan(0.02);
        }
        if (m === 0) expect(f.exposure_h).toBeLessThan(1e-3 * max + 1e-9);
      });
    });
    expect(compared).toBeGreaterThan(0);
    if (process.env.SWATHE_SHOW) console.log(`${variant}: ${compared} compared, worst ${worst}`);
  }, 300_000);

  it('uniform sky: mean T_ant in the beam is the Cane/Dulk + CMB brightness; noise is the radiometer equation with the exposure', async () => {
    const r = await run(variant);
    let inBeam = 0;
    for (const t of r.summary.targets!) {
      t.frequencies.forEach((f) => {
        expect(f.usable_hours_in_beam).toBeLessThanOrEqual(r.summary.hours.usable + 1e-9);
        if (f.usable_hours_in_beam > 0) {
          inBeam++;
          expect(Math.abs(f.t_ant_mean_k / caneDulkK(f.mhz) - 1), `${t.name} ${f.mhz} MHz`).toBeLessThan(1e-5);
        } else expect(f.t_ant_mean_k).toBeNaN();
        if (f.exposure_h > 0) {
          // sigma = T_sys / sqrt(bandwidth x integration time), T_sys = T_sky + T_receiver (Dicke 1946)
          const want = (caneDulkK(f.mhz) + 300) / Math.sqrt(1e6 * f.exposure_h * 3600);
          expect(Math.abs(f.noise_k / want - 1), `${t.name} ${f.mhz} MHz`).toBeLessThan(1e-5);
        } else expect(f.noise_k).toBeNaN();
      });
    }
    expect(inBeam).toBeGreaterThan(0);
  }, 300_000);
});

describe('target outputs', () => {
  it('summary.json and targets.csv carry one entry per target and one row per target x frequency', async () => {
    const r = await run('dipole');
    const js = JSON.parse(summaryJson(r.summary));
    expect(js.targets.map((t: { name: string }) => t.name).slice(0, TARGETS.length)).toEqual(TARGETS.map((t) => t.name));
    expect(Object.keys(js.targets[0])).toEqual(['name', 'ra_deg', 'dec_deg', 'l_deg', 'b_deg', 'frequencies']);
    expect(Object.keys(js.targets[0].frequencies[0])).toEqual(['mhz', 'usable_hours_in_beam', 'exposure_h', 't_ant_mean_k', 'noise_k']);
    const lines = targetsCsv(r).trim().split('\n');
    expect(lines[0]).toBe('name,ra_deg,dec_deg,l_deg,b_deg,frequency_mhz,usable_hours_in_beam_h,exposure_h,t_ant_mean_k,noise_k');
    expect(lines.length).toBe(1 + js.targets.length * 2);
    // a name with a comma is quoted (RFC 4180)
    expect(lines.some((l) => l.startsWith('"e, east",300,-22,'))).toBe(true);
    const c = lines.find((l) => l.startsWith('c,'))!.split(',');
    expect(Number(c[3])).toBe(0);
    expect(Number(c[4])).toBe(0);
    expect(Number(c[6])).toBeCloseTo(js.targets[2].frequencies[0].usable_hours_in_beam, 6);
  }, 300_000);
});

import { readFileSync, readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import Ajv2020 from 'ajv/dist/2020';
import { parseScenario, SCENARIO_LIMITS as L } from '../../src/core/scenario';
import { scenarioJsonSchema } from '../../src/core/scenarioSchema';
import { DEMO_SCENARIO } from '../../src/core/demo';

// The published JSON Schema (public/swathe.scenario.schema.json) is read by a
// general-purpose validator, Ajv (JSON Schema draft 2020-12), and must agree
// with the project's own validation (scenario.ts) on every single-field case
// below: both accept the values at the ends of each stated range and both
// refuse values just outside it. Rules that span several fields are only in
// scenario.ts (the schema says so).

const published = JSON.parse(readFileSync(new URL('../../public/swathe.scenario.schema.json', import.meta.url), 'utf8'));
const ajv = new Ajv2020({ allErrors: true, strict: false });
const check = ajv.compile(published);

const clone = <T>(x: T): T => JSON.parse(JSON.stringify(x));
const base = (): Record<string, any> => clone(DEMO_SCENARIO) as Record<string, any>;

function setPath(o: Record<string, any>, path: (string | number)[], v: unknown): void {
  let cur: any = o;
  for (const k of path.slice(0, -1)) cur = cur[k];
  cur[path[path.length - 1]] = v;
}


/** A scenario with each antenna/sky/constraint block present, so their fields can be varied. */
function rich(model: 'elliptical_gaussian' | 'dipole'): Record<string, any> {
  const s = base();
  delete s.telescope.aperture_m;
  s.telescope.frequencies_mhz = [30, 60];
  s.telescope.beam = model === 'dipole'
    ? { model, length_m: 5, height_m: 1.2, axis_azimuth_deg: 90 }
    : { model, length_m: 60, width_m: 20, fwhm_factor: 1.15, axis_azimuth_deg: 10 };
  s.telescope.pointing = { elevation_deg: 80, azimuth_deg: 180 };
  s.telescope.feeds = [{ x_offset_deg: 2, y_offset_deg: -2 }];
  s.telescope.bandwidth_mhz = 1;
  s.telescope.receiver_temp_k = 100;
  s.constraints = { sun_max_elev_deg: 0, earth_max_elev_deg: 0, horizon_mask: [[0, 5], [180, 6]], diffraction: { rim_distance_m: 600, min_attenuation_db: 15 }, sun_min_separation_deg: 10 };
  s.map = { nside: 32, galactic_band_deg: 10, galactic_center_radius_deg: 20 };
  s.sky = { model: 'uniform', ground_temp_k: 200 };
  return s;
}

type Range = readonly [number, number];
const numericFields: [string, (string | number)[], Range, () => Record<string, any>][] = [
  ['site.lat_deg', ['site', 'lat_deg'], L.lat_deg, base],
  ['span.step_min', ['span', 'step_min'], L.step_min, base],
  ['telescope.frequencies_mhz[0] (dipole)', ['telescope', 'frequencies_mhz', 0], [0.03, L.frequency_mhz[1]], () => rich('dipole')],
  ['telescope.beam.fwhm_factor', ['telescope', 'beam', 'fwhm_factor'], L.fwhm_factor, () => rich('elliptical_gaussian')],
  ['telescope.beam.length_m (dipole)', ['telescope', 'beam', 'length_m'], L.beam_size_m, () => rich('dipole')],
  ['telescope.beam.axis_azimuth_deg', ['telescope', 'beam', 'axis_azimuth_deg'], L.axis_azimuth_deg, () => rich('dipole')],
  ['telescope.bandwidth_mhz', ['telescope', 'bandwidth_mhz'], L.bandwidth_mhz, () => rich('dipole')],
  ['telescope.receiver_temp_k', ['telescope', 'receiver_temp_k'], L.receiver_temp_k, () => rich('dipole')],
  ['telescope.pointing.azimuth_deg', ['telescope', 'pointing', 'azimuth_deg'], L.pointing_azimuth_deg, () => rich('dipole')],
  ['constraints.sun_max_elev_deg', ['constraints', 'sun_max_elev_deg'], L.elev_deg, () => rich('dipole')],
  ['constraints.horizon_mask[0][1]', ['constraints', 'horizon_mask', 0, 1], L.horizon_el_deg, () => rich('dipole')],
  ['constraints.diffraction.min_attenuation_db', ['constraints', 'diffraction', 'min_attenuation_db'], L.min_attenuation_db, () => rich('dipole')],
  ['constraints.sun_min_separation_deg', ['constraints', 'sun_min_separation_deg'], L.sun_min_separation_deg, () => rich('dipole')],
  ['map.galactic_band_deg', ['map', 'galactic_band_deg'], L.galactic_band_deg, () => rich('dipole')],
  ['map.galactic_center_radius_deg', ['map', 'galactic_center_radius_deg'], L.galactic_center_radius_deg, () => rich('dipole')],
  ['sky.ground_temp_k', ['sky', 'ground_temp_k'], L.ground_temp_k, () => rich('dipole')],
];

const cases: { what: string; make: () => Record<string, any>; valid: boolean }[] = [];
for (const [name, path, [lo, hi], make] of numericFields) {
  const eps = Math.max(1e-9, Math.abs(hi - lo) * 1e-6);
  cases.push({ what: `${name} = ${lo} (lowest allowed)`, make: () => { const s = make(); setPath(s, path, lo); return s; }, valid: true });
  cases.push({ what: `${name} = ${hi} (highest allowed)`, make: () => { const s = make(); setPath(s, path, hi); return s; }, valid: true });
  cases.push({ what: `${name} just above the range`, make: () => { const s = make(); setPath(s, path, hi + eps); return s; }, valid: false });
  cases.push({ what: `${name} as text`, make: () => { const s = make(); setPath(s, path, String(lo)); return s; }, valid: false });
  if (lo !== 0.03) cases.push({ what: `${name} just below the range`, make: () => { const s = make(); setPath(s, path, lo - eps); return s; }, valid: false });
}
const structural: [string, (s: Record<string, any>) => void, boolean][] = [
  ['an unknown top-level key', (s) => { s.colour = 'red'; }, false],
  ['an unknown key in site', (s) => { s.site.altitude = 3; }, false],
  ['$schema given as text', (s) => { s.$schema = './swathe.scenario.schema.json'; }, true],
  ['$schema given as a number', (s) => { s.$schema = 3; }, false],
  ['body "venus"', (s) => { s.site.body = 'venus'; }, false],
  ['no frequencies', (s) => { s.telescope.frequencies_mhz = []; }, false],
  ['17 frequencies', (s) => { s.telescope.frequencies_mhz = Array.from({ length: 17 }, (_, i) => 10 + i); }, false],
  ['16 frequencies', (s) => { s.telescope.frequencies_mhz = Array.from({ length: 16 }, (_, i) => 10 + i); }, true],
  ['a span time without Z', (s) => { s.span.start = '2031-01-01T00:00:00'; }, false],
  ['a span time with milliseconds', (s) => { s.span.start = '2031-01-01T00:00:00.250Z'; }, true],
  ['beam model "horn"', (s) => { s.telescope.beam = { model: 'horn' }; }, false],
  ['a dipole field on the gaussian beam', (s) => { s.telescope.beam = { model: 'gaussian', height_m: 2 }; }, false],
  ['step_min null (automatic)', (s) => { s.span.step_min = null; }, true],
  ['a horizon mask point with a rim distance', (s) => { s.constraints = { ...s.constraints, horizon_mask: [[0, 5, 300], [180, 6, 400]] }; }, true],
  ['a horizon mask point with four values', (s) => { s.constraints = { ...s.constraints, horizon_mask: [[0, 5, 300, 1]] }; }, false],
  ['sky model "map" with one map and an index', (s) => { s.sky = { model: 'map', maps: [{ file: 'sky408.fits', frequency_mhz: 408 }], spectral_index: -2.5 }; }, true],
  ['sky model "haze"', (s) => { s.sky = { model: 'haze' }; }, false],
  ['a feed offset of 61 degrees', (s) => { s.telescope.feeds = [{ x_offset_deg: 61, y_offset_deg: 0 }]; }, false],
  ['targets in RA/Dec and l/b at the ends of their ranges', (s) => { s.targets = [{ name: 'A', ra_deg: 0, dec_deg: -90 }, { name: 'B', l_deg: 359.999, b_deg: 90 }]; }, true],
  ['a target at dec 95', (s) => { s.targets = [{ name: 'A', ra_deg: 10, dec_deg: 95 }]; }, false],
  ['a target at b -91', (s) => { s.targets = [{ name: 'A', l_deg: 10, b_deg: -91 }]; }, false],
  ['a target at ra 360', (s) => { s.targets = [{ name: 'A', ra_deg: 360, dec_deg: 0 }]; }, false],
  ['a target at ra 400', (s) => { s.targets = [{ name: 'A', ra_deg: 400, dec_deg: 0 }]; }, false],
  ['a target at l -0.5', (s) => { s.targets = [{ name: 'A', l_deg: -0.5, b_deg: 0 }]; }, false],
  ['a target with both coordinate pairs', (s) => { s.targets = [{ name: 'A', ra_deg: 1, dec_deg: 2, l_deg: 3, b_deg: 4 }]; }, false],
  ['a target with no position', (s) => { s.targets = [{ name: 'A' }]; }, false],
  ['a target with no name', (s) => { s.targets = [{ ra_deg: 1, dec_deg: 2 }]; }, false],
  ['a target with an empty name', (s) => { s.targets = [{ name: '', ra_deg: 1, dec_deg: 2 }]; }, false],
  ['32 targets', (s) => { s.targets = Array.from({ length: 32 }, (_, i) => ({ name: `T${i}`, ra_deg: i, dec_deg: 0 })); }, true],
  ['33 targets', (s) => { s.targets = Array.from({ length: 33 }, (_, i) => ({ name: `T${i}`, ra_deg: i, dec_deg: 0 })); }, false],
  ['an empty target list', (s) => { s.targets = []; }, true],
];
for (const [what, edit, valid] of structural) cases.push({ what, make: () => { const s = base(); edit(s); return s; }, valid });

describe('published scenario JSON Schema (Ajv, draft 2020-12) agrees with scenario.ts', () => {
  it('public/swathe.scenario.schema.json is up to date (npx tsx scripts/write-scenario-schema.ts)', () => {
    expect(published).toEqual(JSON.parse(JSON.stringify(scenarioJsonSchema())));
  });

  it('the demo, the fixture scenarios and every variant below are valid to both', () => {
    const dir = new URL('../fixtures/scenarios/', import.meta.url);
    const files = readdirSync(dir).filter((f) => f.endsWith('.json'));
    expect(files.length).toBeGreaterThan(0);
    for (const s of [DEMO_SCENARIO, rich('dipole'), rich('elliptical_gaussian'), ...files.map((f) => JSON.parse(readFileSync(new URL(f, dir), 'utf8')))]) {
      expect(parseScenario(s).ok).toBe(true);
      expect(check(s), JSON.stringify(check.errors)).toBe(true);
    }
  });

  it.each(cases.map((c) => [c.what, c] as const))('%s', (_what, c) => {
    const s = c.make();
    const own = parseScenario(s);
    expect(own.ok, own.ok ? '' : own.issues.map((i) => i.message).join('; ')).toBe(c.valid);
    expect(check(s), JSON.stringify(check.errors)).toBe(c.valid);
  });
});

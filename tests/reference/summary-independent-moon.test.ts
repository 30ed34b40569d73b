// Issue 2, "Done when": the CLI, run on scenarios no one here has seen, gives
// hours, zenith ranges and galactic dwell close to an independent computation.
// Here: two invented lunar sites (tests/fixtures/independent/moon-*.json: a
// far-side crater site and one near the west limb), `swathe plan` run as a user
// would, against a computation built only from Jean Meeus, "Astronomical
// Algorithms" (2nd ed. 1998) through the `astronomia` npm package (4.2.0), which
// shares no code with astronomy-engine:
//   - Moon's geocentric position: ch. 47 (astronomia moonposition), mean ecliptic
//     and equinox of date, km;
//   - Sun: ch. 25/32 VSOP87 (astronomia solar.apparentVSOP87 with its nutation in
//     longitude removed, so mean equinox of date with aberration, like ours);
//   - the Moon-fixed frame: ch. 53 (astronomia moon.Moon: I = 1.54242 deg, node Ω,
//     argument of latitude F, physical librations ρ, σ, τ). The mean lunar equator
//     has its ascending node at Ω + σ/sin I (Meeus' position-angle formula) and
//     inclination I + ρ to the ecliptic of date; its prime meridian lies F + 180 +
//     τ - σ/sin I beyond that node. The test first checks that this frame gives
//     back astronomia's own sub-Earth point (moon.physical, eqs. 53.1-53.2) within
//     0.001 deg, so the frame is Meeus' and not a guess;
//   - ecliptic of date to J2000 ecliptic: ch. 21 (astronomia precess.EclipticPrecessor);
//     J2000 ecliptic to equator with the mean obliquity 84381.448" (IAU 1976, the
//     J2000 mean ecliptic our summary uses);
//   - galactic l/b: the ICRS-to-galactic definition of the Hipparcos Catalogue
//     (ESA 1997, vol. 1, sec. 1.5.3): pole RA 192.85948, Dec +27.12825, l of the
//     celestial pole 122.93192 deg;
//   - TT = UTC + 69.184 s (TAI-UTC = 37 s since 2017, assumed unchanged);
//   - lunar radius 1737.4 km (IAU mean radius), spherical; Sun and Earth
//     elevations topocentric (the site's offset from the Moon's centre).
//
// Tolerances and why:
// - zenith ranges: 0.04 deg, not the issue's 0.02. Meeus' libration series are an
//   approximation of the lunar rotation: about 0.03 deg from the NASA table in
//   latitude (see ephemeris-meeus.test.ts, which uses 0.04 too); our frame is the
//   IAU model checked against NASA's table within 0.01 deg in
//   ephemeris-nasa-subpoints.test.ts. The frame built here is itself measured
//   against that NASA table below (0.028 deg at worst in 2021), and the largest
//   per-sample zenith difference is printed: this reference cannot show agreement
//   better than its own error.
// - hours (sun_down, earth_down, usable): 0.5% (the figure). Why that holds
//   with a 0.03-deg reference: the Sun climbs 360 deg per synodic month times
//   cos(latitude) = 0.51 cos(lat) deg/h, so 0.03 deg moves a sunrise by 0.06 h; at
//   most one 40-min sample flips per crossing (about 37 sunrises and sunsets in the
//   span, so at most 25 h of about 6,400 h = 0.4%). Every sample whose flags differ
//   must have a reference elevation within 0.06 deg of the threshold (asserted).
// - galactic dwell (tens of hours here): each sample is 0.67 h, so 0.5% of 30 h is
//   less than one sample. Allowed: max(0.5%, the hours of the samples whose
//   in-band / near-centre flag differs), where each such sample must lie within
//   0.06 deg of the band edge or radius in the reference (asserted).
import { describe, expect, it } from 'vitest';
import { runPlanCli } from '../fixtures/independent/runPlanCli';
import { join } from 'node:path';
import { D, dot, epochAt, lonLat, mv, sph, siteSample, wrapDeg, earth, TT_MINUS_UTC_S, type V3 } from '../fixtures/independent/meeusMoon';
import { moon } from 'astronomia';
import { readSubpoints } from '../fixtures/ephemeris/parse';
import { spawnSync } from 'node:child_process';
import { compareFrequencies, type RefFrequency } from '../fixtures/independent/compareFrequencies';
import { PY, requirePython } from './pythonRef';

// Per-frequency figures (FWHM, sky fraction covered, exposure max and median over the
// covered sky, hours with the beam on the band and near the centre): this Meeus track
// and its own usable flags go to plan_frequencies.py (healpy query_disc, a brute-force
// beam sum, scipy's J1), tolerances in compareFrequencies.ts.
const hasHealpy = requirePython(['healpy', 'scipy.special', 'numpy'], 'the per-frequency check of Moon plans (plan_frequencies.py)');
const PLAN_FREQ = join(import.meta.dirname, 'plan_frequencies.py');

const ROOT = join(import.meta.dirname, '..', '..');

interface Row { ms: number; usable: number; sun: number; earth: number; ra: number; dec: number; l: number; b: number }

function runCli(scenarioPath: string): { summary: any; rows: Row[] } {
  const { summary, rows } = runPlanCli(scenarioPath);
  return { summary, rows: rows.map((v) => ({
    ms: Date.parse(v('utc')), usable: Number(v('usable')), sun: Number(v('sun_elev_deg')),
    earth: Number(v('earth_elev_deg')), ra: Number(v('ra_deg')), dec: Number(v('dec_deg')),
    l: Number(v('l_deg')), b: Number(v('b_deg')),
  })) };
}

const relErr = (a: number, ref: number) => Math.abs(a - ref) / Math.max(Math.abs(ref), 1e-12);
const FIXTURES = ['moon-farside.json', 'moon-limb.json'].map((f) => join(ROOT, 'tests', 'fixtures', 'independent', f));
const NEAR = 0.06; // deg: how close to a threshold a disagreeing sample must be (Meeus ~0.03 deg, doubled)

describe('Meeus ch. 53 Moon-fixed frame built here', () => {
  it("gives back astronomia's own sub-Earth and sub-solar points (moon.physical) within 0.001 / 0.01 deg", () => {
    let worstE = 0, worstS = 0;
    for (let k = 0; k < 120; k++) {
      const utcMs = Date.UTC(2032, 2, 1) + k * 4.37 * 86_400_000;
      const jde = utcMs / 86_400_000 + 2440587.5 + TT_MINUS_UTC_S / 86_400;
      const e = epochAt(utcMs);
      const [cm, , cs] = moon.physical(jde, earth);
      const [l, b] = lonLat(mv(e.frame, e.moonKm.map((x) => -x) as V3));
      worstE = Math.max(worstE, Math.abs(wrapDeg((l - cm.lon) / D)), Math.abs((b - cm.lat) / D));
      const toSun = [0, 1, 2].map((i) => e.sunKm[i] - e.moonKm[i]) as V3;
      const [l0, b0] = lonLat(mv(e.frame, toSun));
      worstS = Math.max(worstS, Math.abs(wrapDeg((l0 - cs.lon) / D)), Math.abs((b0 - cs.lat) / D));
    }
    expect(worstE).toBeLessThan(0.001);
    // astronomia's sub-solar point keeps the nutation in the Sun's longitude (up to 0.005 deg) and
    // uses Meeus' approximate heliocentric correction; ours removes the nutation: 0.01 deg
    expect(worstS).toBeLessThan(0.01);
  });
});

describe("the reference's own error: this Meeus frame vs the NASA SVS 2021 table (JPL DE421)", () => {
  it('sub-Earth and sub-solar selenographic points within 0.04 deg (Meeus ch. 53 is an approximation)', () => {
    // NASA Scientific Visualization Studio, "Moon Phase and Libration 2021" (tests/fixtures/ephemeris/
    // moon-subpoints-2021-3h.txt): this is what bounds the Moon tolerances below.
    const rows = readSubpoints().filter((_, i) => i % 8 === 0);
    let worstE = 0, worstS = 0;
    for (const r of rows) {
      const e = epochAt(r.t_ms);
      const [el, eb] = lonLat(mv(e.frame, e.moonKm.map((x) => -x) as V3));
      const [sl, sb] = lonLat(mv(e.frame, [0, 1, 2].map((i) => e.sunKm[i] - e.moonKm[i]) as V3));
      const ang = (l1: number, b1: number, l2: number, b2: number) =>
        Math.acos(Math.min(1, dot(sph(l1, b1), sph(l2 * D, b2 * D)))) / D;
      worstE = Math.max(worstE, ang(el, eb, r.elon, r.elat));
      worstS = Math.max(worstS, ang(sl, sb, r.slon, r.slat));
    }
    console.log(`Meeus frame vs NASA SVS 2021 (${rows.length} rows): sub-Earth point worst ${worstE.toFixed(4)} deg, sub-solar point worst ${worstS.toFixed(4)} deg`);
    expect(rows.length).toBeGreaterThan(300);
    expect(worstE).toBeLessThan(0.04);
    expect(worstS).toBeLessThan(0.04);
  });
});

describe('swathe plan summary vs an independent Meeus/astronomia computation (Moon sites)', () => {
  it('hours within 0.5%, zenith ranges within 0.04 deg, galactic dwell within 0.5% or the flipped samples; per-frequency figures against healpy', () => {
    const runs = FIXTURES.map((f) => ({ f, ...runCli(f) }));
    expect(new Set(runs.map((r) => r.summary.scenario.telescope.beam.model))).toEqual(new Set(['gaussian', 'airy']));
    // both fixtures share span and step: one set of epochs serves both sites
    const grid = runs[0].rows.map((r) => r.ms);
    for (const r of runs) expect(r.rows.map((x) => x.ms)).toEqual(grid);
    const epochs = grid.map(epochAt);
    const report: string[] = [];
    for (const { f, summary: s, rows } of runs) {
      const name = f.split('/').pop();
      const sc = s.scenario;
      const c = sc.constraints;
      const stepH = s.step_min / 60;
      const endMs = Date.parse(sc.span.end);
      // the sample grid: t_i = start + i*step before end, weight min(step, end - t_i)
      const startMs = Date.parse(sc.span.start);
      const n = Math.ceil((endMs - startMs) / (s.step_min * 60_000));
      expect(s.samples, `${name} samples`).toBe(n);
      const w = grid.map((t) => Math.min(s.step_min * 60_000, endMs - t) / 3_600_000);
      const ref = epochs.map((e) => siteSample(e, sc.site.lat_deg, sc.site.lon_deg));
      const sunThr = c.sun_max_elev_deg ?? 0, earthThr = c.earth_max_elev_deg ?? 0;
      const band = sc.map.galactic_band_deg, rad = sc.map.galactic_center_radius_deg;
      const gcDist = (l: number, b: number) => Math.acos(Math.min(1, Math.cos(b * D) * Math.cos(l * D))) / D;
      let total = 0, sunDown = 0, earthDown = 0, usable = 0, inBand = 0, near = 0;
      let flipUse = 0, flipBandH = 0, flipNearH = 0, worstZ = 0, worstSun = 0, worstEarth = 0;
      const uRef: number[] = [], amb: number[] = [];
      ref.forEach((r, i) => {
        total += w[i];
        const sd = r.sun < sunThr, ed = r.earth < earthThr;
        if (sd) sunDown += w[i];
        if (ed) earthDown += w[i];
        const u = (c.sun_max_elev_deg === null || sd) && (c.earth_max_elev_deg === null || ed);
        if (u) usable += w[i];
        uRef.push(u ? 1 : 0);
        // a sample whose usable flag differs (asserted below to lie within NEAR of a threshold)
        amb.push(rows[i].usable !== (u ? 1 : 0) ? 1 : 0);
        if (u && Math.abs(r.b) < band) inBand += w[i];
        if (u && gcDist(r.l, r.b) < rad) near += w[i];
        const row = rows[i];
        worstZ = Math.max(worstZ, Math.acos(Math.min(1, dot(r.z, sph(row.ra * D, row.dec * D)))) / D);
        worstSun = Math.max(worstSun, Math.abs(r.sun - row.sun));
        worstEarth = Math.max(worstEarth, Math.abs(r.earth - row.earth));
        if ((u ? 1 : 0) !== row.usable) {
          flipUse++;
          const m = Math.min(Math.abs(r.sun - sunThr), Math.abs(r.earth - earthThr));
          expect(m, `${name} sample ${i}: usable differs ${m} deg away from a threshold`).toBeLessThan(NEAR);
        }
        if (u && row.usable) {
          if ((Math.abs(r.b) < band) !== (Math.abs(row.b) < band)) {
            flipBandH += w[i];
            expect(Math.abs(Math.abs(r.b) - band), `${name} sample ${i}: in-band differs away from the edge`).toBeLessThan(NEAR);
          }
          if ((gcDist(r.l, r.b) < rad) !== (gcDist(row.l, row.b) < rad)) {
            flipNearH += w[i];
            expect(Math.abs(gcDist(r.l, r.b) - rad), `${name} sample ${i}: near-centre differs away from the radius`).toBeLessThan(NEAR);
          }
        }
      });
      // the scenarios exercise the comparisons
      expect(sunDown).toBeGreaterThan(0.4 * total);
      expect(usable).toBeGreaterThan(0.05 * total);
      report.push(`${name}: per-sample worst zenith ${worstZ.toFixed(4)} deg, Sun elevation ${worstSun.toFixed(4)}, Earth elevation ${worstEarth.toFixed(4)}; usable flags differ at ${flipUse} of ${rows.length}`);

      expect(Math.abs(s.hours.total - total), `${name} total hours`).toBeLessThan(1e-6);
      const hours: [string, number, number][] = [['sun_down', s.hours.sun_down, sunDown], ['earth_down', s.hours.earth_down, earthDown], ['usable', s.hours.usable, usable]];
      for (const [key, a, b] of hours) {
        expect(relErr(a, b), `${name} hours.${key} ${a} vs Meeus ${b}`).toBeLessThan(0.005);
        report.push(`${name} hours.${key}: ${a.toFixed(3)} vs ${b.toFixed(3)} h (${(100 * relErr(a, b)).toFixed(3)}%)`);
      }
      const zen: [string, number, number][] = [
        ['dec_min_deg', s.zenith.dec_min_deg, Math.min(...ref.map((r) => r.dec))],
        ['dec_max_deg', s.zenith.dec_max_deg, Math.max(...ref.map((r) => r.dec))],
        ['ecl_lat_min_deg', s.zenith.ecl_lat_min_deg, Math.min(...ref.map((r) => r.eclLat))],
        ['ecl_lat_max_deg', s.zenith.ecl_lat_max_deg, Math.max(...ref.map((r) => r.eclLat))],
      ];
      for (const [key, a, b] of zen) {
        expect(Math.abs(a - b), `${name} zenith.${key} ${a} vs Meeus ${b}`).toBeLessThan(0.04);
        report.push(`${name} zenith.${key}: ${a.toFixed(4)} vs ${b.toFixed(4)} (diff ${Math.abs(a - b).toFixed(4)} deg)`);
      }
      const gal: [string, number, number, number][] = [
        ['usable_hours_zenith_in_band', s.galactic.usable_hours_zenith_in_band, inBand, flipBandH],
        ['usable_hours_zenith_near_center', s.galactic.usable_hours_zenith_near_center, near, flipNearH],
      ];
      for (const [key, a, b, flipH] of gal) {
        // usable flips also move dwell hours: count those samples' weight too
        const allowed = Math.max(0.005 * b, flipH + flipUse * stepH) + 1e-9;
        expect(Math.abs(a - b), `${name} galactic.${key} ${a} vs Meeus ${b} (allowed ${allowed})`).toBeLessThanOrEqual(allowed);
        report.push(`${name} galactic.${key}: ${a.toFixed(3)} vs ${b.toFixed(3)} h (allowed ${allowed.toFixed(3)})`);
      }
      // the limits are not 0, so a sign error in them shows
      expect(c.sun_max_elev_deg).not.toBe(0);
      if (hasHealpy) {
        const t = sc.telescope;
        const py = spawnSync(PY, [PLAN_FREQ], {
          input: JSON.stringify({
            z: ref.map((r) => r.z), w, usable: uRef, b_deg: ref.map((r) => r.b), gc_deg: ref.map((r) => gcDist(r.l, r.b)),
            step_h: stepH, frequencies_mhz: t.frequencies_mhz, aperture_m: t.aperture_m, model: t.beam.model,
            fwhm_factor: t.beam.fwhm_factor, band_deg: band, center_radius_deg: rad, nside: sc.map.nside, near_deg: NEAR, ambiguous: amb,
          }),
          encoding: 'utf8', maxBuffer: 1 << 26, timeout: 300_000,
        });
        expect(py.status, py.stderr).toBe(0);
        const pf = JSON.parse(py.stdout) as { healpy: string; per_frequency: RefFrequency[] };
        report.push(`${name}: healpy ${pf.healpy}`);
        report.push(...compareFrequencies(name!, s, pf.per_frequency));
      }
    }
    console.log(report.join('\n'));
  }, 600_000);
});

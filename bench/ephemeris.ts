// Ephemeris benchmark: the fast (interpolated) track against the exact
// per-sample path and the rotation-only floor, measured in one run.
//
// Lunar case (issue 2 item 8): a full 18.6-year nodal cycle (6798.38 d) of a
// lunar site at a 10-minute step (~979,000 samples) with Sun and Earth
// constraints. The fast path runs on the whole span; the exact path and the
// floor run on slices spread evenly over the span (their cost per sample is
// flat, so the full-span time is the per-sample time times the sample count;
// pass { exactFull: true } to run the exact path on everything). Deviations are
// the largest over all slice samples. An Earth case (one year at 2 min) shows the
// same for a fast-spinning body.
import { computeTrack, rotationOnlyStage, trackStage } from '../src/core/ephemeris';
import { usableMask } from '../src/core/usable';
import { DEMO_SCENARIO } from '../src/core/demo';
import { drain, type Scenario, type Track } from '../src/core/types';

const DEG = Math.PI / 180;

interface CaseResult {
  name: string;
  samples: number;
  fast_s: number;
  exact_s_est: number;
  exact_samples_run: number;
  floor_s_est: number;
  ratio_exact_over_fast: number;
  ratio_fast_over_floor: number;
  zenith_max_dev_deg: number;
  sun_elev_max_dev_deg: number;
  earth_elev_max_dev_deg: number | null;
  usable_flag_mismatches: number;
}

function withSpan(s: Scenario, start: number, n: number, step: number): Scenario {
  return { ...s, span: { start: new Date(start).toISOString().replace('.000Z', 'Z'), end: new Date(start + n * step * 60_000).toISOString().replace('.000Z', 'Z'), step_min: step } };
}

function runCase(name: string, s: Scenario, slices: number, sliceLen: number, exactFull: boolean): CaseResult {
  // warm-up so the JIT has compiled both paths
  computeTrack(withSpan(s, Date.parse(s.span.start), 3000, s.span.step_min!), { mode: 'fast' });
  computeTrack(withSpan(s, Date.parse(s.span.start), 300, s.span.step_min!), { mode: 'exact' });

  let t = performance.now();
  const fast = computeTrack(s, { mode: 'fast' });
  const uf = usableMask(fast, s.constraints);
  const fastS = (performance.now() - t) / 1000;

  const step = fast.step_min;
  const starts: number[] = [];
  if (exactFull) starts.push(0);
  else for (let k = 0; k < slices; k++) starts.push(Math.floor((k * (fast.n - sliceLen)) / Math.max(1, slices - 1)));
  const len = exactFull ? fast.n : sliceLen;

  let exactS = 0, floorS = 0, run = 0, dz = 0, dse = 0, dee = 0, mism = 0;
  for (const i0 of starts) {
    const sub = withSpan(s, fast.t0_ms + i0 * step * 60_000, len, step);
    t = performance.now();
    const ex: Track = drain(trackStage(sub, { mode: 'exact' }));
    const ue = usableMask(ex, s.constraints);
    exactS += (performance.now() - t) / 1000;
    t = performance.now();
    drain(rotationOnlyStage(sub));
    floorS += (performance.now() - t) / 1000;
    run += ex.n;
    for (let j = 0; j < ex.n; j++) {
      const i = i0 + j;
      const dot = fast.zx[i] * ex.zx[j] + fast.zy[i] * ex.zy[j] + fast.zz[i] * ex.zz[j];
      const cx = fast.zy[i] * ex.zz[j] - fast.zz[i] * ex.zy[j];
      const cy = fast.zz[i] * ex.zx[j] - fast.zx[i] * ex.zz[j];
      const cz = fast.zx[i] * ex.zy[j] - fast.zy[i] * ex.zx[j];
      dz = Math.max(dz, Math.atan2(Math.hypot(cx, cy, cz), dot) / DEG);
      dse = Math.max(dse, Math.abs(fast.sun_elev_deg[i] - ex.sun_elev_deg[j]));
      if (ex.earth_elev_deg) dee = Math.max(dee, Math.abs(fast.earth_elev_deg![i] - ex.earth_elev_deg[j]));
      if (uf[i] !== ue[j]) mism++;
    }
  }
  const exactEst = (exactS / run) * fast.n;
  const floorEst = (floorS / run) * fast.n;
  return {
    name, samples: fast.n, fast_s: fastS, exact_s_est: exactEst, exact_samples_run: run, floor_s_est: floorEst,
    ratio_exact_over_fast: exactEst / fastS, ratio_fast_over_floor: fastS / floorEst,
    zenith_max_dev_deg: dz, sun_elev_max_dev_deg: dse, earth_elev_max_dev_deg: fast.earth_elev_deg ? dee : null,
    usable_flag_mismatches: mism,
  };
}

export async function benchEphemeris(opts: { exactFull?: boolean } = {}): Promise<{ lines: string[]; result: object }> {
  const exactFull = !!opts.exactFull;
  const moon: Scenario = {
    ...DEMO_SCENARIO,
    span: { start: '2031-01-01T00:00:00Z', end: new Date(Date.parse('2031-01-01T00:00:00Z') + 6798.38 * 86_400_000).toISOString(), step_min: 10 },
    constraints: { sun_max_elev_deg: 0, earth_max_elev_deg: 0, horizon_mask: null },
  };
  moon.span.end = moon.span.end.replace(/\.\d{3}Z$/, 'Z');
  const earth: Scenario = {
    ...DEMO_SCENARIO,
    site: { body: 'earth', lat_deg: 38.4, lon_deg: -79.8 },
    span: { start: '2031-01-01T00:00:00Z', end: '2032-01-01T00:00:00Z', step_min: 2 },
    constraints: { sun_max_elev_deg: -6, earth_max_elev_deg: null, horizon_mask: null },
  };
  const cases = [
    runCase('moon site, 18.6-year nodal cycle, 10-min step, Sun + Earth constraints', moon, 20, 2500, exactFull),
    runCase('earth site, 1 year, 2-min step, Sun constraint', earth, 20, 2500, exactFull),
  ];
  const lines: string[] = ['ephemeris: fast (interpolated) track vs exact per-sample path, one run'];
  for (const c of cases) {
    const how = exactFull ? 'exact on all samples' : `exact and floor on ${c.exact_samples_run} samples in 20 slices, scaled per sample`;
    lines.push(
      `  ${c.name}: ${c.samples} samples (${how})`,
      `    fast ${c.fast_s.toFixed(2)} s | exact ${c.exact_s_est.toFixed(1)} s | rotation-only floor ${c.floor_s_est.toFixed(2)} s`,
      `    exact/fast = ${c.ratio_exact_over_fast.toFixed(1)}x (goal >= 10x)   fast/floor = ${c.ratio_fast_over_floor.toFixed(2)}x`,
      `    max deviation: zenith ${c.zenith_max_dev_deg.toExponential(2)} deg (goal < 1e-3), Sun elevation ${c.sun_elev_max_dev_deg.toExponential(2)} deg` +
        (c.earth_elev_max_dev_deg === null ? '' : `, Earth elevation ${c.earth_elev_max_dev_deg.toExponential(2)} deg`) + ' (goal < 1e-2)' +
        `, usable flags differing: ${c.usable_flag_mismatches}`,
    );
  }
  return { lines, result: { ephemeris: cases } };
}

// Antenna benchmark (issue 11 item 8), measured in one run on this machine:
//   fast  = the whole plan as the app and CLI run it (runPlan: ephemeris,
//           usable flags, exposure, covered sky and band hours by the body's
//           spin (src/core/antenna/spin.ts), noise, summary), full span, best of 2;
//   naive = the exact ephemeris and the beam evaluated at every output pixel
//           within its cutoff for every usable sample (antenna/exposure.ts
//           naiveExposureFor), on a slice of the span (stated in the output),
//           its time scaled to the full span (its cost is proportional to the
//           number of samples).
// The deviation compares the fast maps with the naive ones on the same slice
// (relative L1: sum|fast - naive| / sum|naive|, worst frequency).

import type { PlanResult, Scenario } from '../src/core/types';
import { drain } from '../src/core/types';
import { computeTrack } from '../src/core/ephemeris';
import { frequencyLimitsStage, usableByFrequency } from '../src/core/shielding/usableByFrequency';
import { antennaBeam, horizonFrames, sampleSegments, segmentsOf } from '../src/core/antenna';
import { naiveExposureFor } from '../src/core/antenna/exposure';
import { relativeL1 } from '../src/core/coverage';
import { runPlan } from '../src/engine/runPlan';

const DAY_MS = 86_400_000;
const iso = (ms: number) => new Date(ms).toISOString().replace('.000Z', 'Z');
function withSpan(s: Scenario, startMs: number, days: number): Scenario {
  return { ...s, span: { ...s.span, start: iso(startMs), end: iso(startMs + days * DAY_MS) } };
}

/** Invented sites and instruments (no real observatory). */
export const ANTENNA_BENCH: { name: string; scenario: Scenario; sliceDays: number }[] = [
  {
    name: 'c: lunar dipole 6 m long, 1.5 m over the ground, nodal cycle 6798.38 d, automatic step, 5/10/20/40 MHz, nside 64',
    sliceDays: 30,
    scenario: withSpan({
      format: 'swathe.scenario/1',
      name: 'bench c: invented far-side dipole over regolith',
      site: { body: 'moon', lat_deg: -41.5, lon_deg: 172.3 },
      span: { start: '', end: '', step_min: null },
      telescope: { frequencies_mhz: [5, 10, 20, 40], beam: { model: 'dipole', fwhm_factor: 1.15, length_m: 6, height_m: 1.5, axis_azimuth_deg: 90 } },
      constraints: { sun_max_elev_deg: 0, earth_max_elev_deg: 0, horizon_mask: null },
      map: { nside: 64, galactic_band_deg: 10, galactic_center_radius_deg: 20 },
    }, Date.UTC(2031, 0, 1), 6798.38),
  },
  {
    name: 'd: Earth fan beam 40 m x 4 m (long side east-west), 1 year, 200/300/400 MHz, nside 256, Sun < -12 deg',
    sliceDays: 1,
    scenario: withSpan({
      format: 'swathe.scenario/1',
      name: 'bench d: invented prairie fan-beam aperture',
      site: { body: 'earth', lat_deg: 38.2, lon_deg: -101.7 },
      span: { start: '', end: '', step_min: null },
      telescope: { frequencies_mhz: [200, 300, 400], beam: { model: 'elliptical_gaussian', fwhm_factor: 1.15, length_m: 40, width_m: 4, axis_azimuth_deg: 90 } },
      constraints: { sun_max_elev_deg: -12, earth_max_elev_deg: null, horizon_mask: null },
      map: { nside: 256, galactic_band_deg: 10, galactic_center_radius_deg: 20 },
    }, Date.UTC(2030, 0, 1), 365),
  },
];

function naiveMaps(s: Scenario): Float64Array[] {
  const track = computeTrack(s, { mode: 'exact' });
  const limits = drain(frequencyLimitsStage(track, s));
  const usable = usableByFrequency(limits.fminMHz, s.telescope.frequencies_mhz);
  const frames = horizonFrames(track, s.site.lon_deg);
  const segs = segmentsOf(s);
  const segOf = sampleSegments(track, segs);
  return s.telescope.frequencies_mhz.map((f, k) => {
    const out = new Float64Array(12 * s.map.nside * s.map.nside);
    segs.forEach((_, g) => {
      const m = drain(naiveExposureFor(track, frames, (i) => usable[k][i] === 1 && segOf[i] === g, antennaBeam(s, f, g), s.map.nside, 1));
      for (let q = 0; q < m.length; q++) out[q] += m[q];
    });
    return out;
  });
}

const cpu = () => { const c = process.cpuUsage(); return (c.user + c.system) / 1e6; };
const REPEATS = 2;

export interface AntennaBenchRow { name: string; fast_s: number; fast_cpu_s: number; naive_s: number; ratio: number; max_rel_dev: number }

export async function benchAntenna(log: (line: string) => void = () => {}): Promise<{ lines: string[]; rows: AntennaBenchRow[] }> {
  const lines: string[] = [];
  const say = (l: string) => { lines.push(l); log(l); };
  const rows: AntennaBenchRow[] = [];
  for (const { name, scenario: s, sliceDays } of ANTENNA_BENCH) {
    const t0 = Date.parse(s.span.start);
    const spanDays = (Date.parse(s.span.end) - t0) / DAY_MS;
    await runPlan(withSpan(s, t0, 2)); // compile every path before timing
    let fast_s = Infinity, fastCpu = Infinity;
    let fast: PlanResult | undefined;
    for (let r = 0; r < REPEATS; r++) {
      const c0 = cpu(), w0 = performance.now();
      fast = await runPlan(s);
      fast_s = Math.min(fast_s, (performance.now() - w0) / 1000);
      fastCpu = Math.min(fastCpu, cpu() - c0);
    }
    const slice = withSpan(s, t0, sliceDays);
    const c0 = cpu(), w0 = performance.now();
    const naive = naiveMaps(slice);
    const naiveSlice_s = (performance.now() - w0) / 1000, naiveSliceCpu = cpu() - c0;
    const scale = spanDays / sliceDays;
    const fastSlice = await runPlan(slice);
    let dev = 0;
    for (let k = 0; k < naive.length; k++) dev = Math.max(dev, relativeL1(fastSlice.maps[k], Float32Array.from(naive[k])));
    const row: AntennaBenchRow = {
      name, fast_s, fast_cpu_s: fastCpu, naive_s: naiveSlice_s * scale,
      ratio: (naiveSlice_s * scale) / fast_s, max_rel_dev: dev,
    };
    rows.push(row);
    say(`antenna ${name}`);
    say(`  samples ${fast!.track.n} (step ${fast!.track.step_min.toFixed(3)} min), usable ${fast!.summary.hours.usable.toFixed(0)} h of ${fast!.summary.hours.total.toFixed(0)} h`);
    say(`  fast  ${fast_s.toFixed(3)} s wall, ${fastCpu.toFixed(3)} s CPU, best of ${REPEATS} (full span: ephemeris, usable, exposure, covered sky, band hours, noise, summary)`);
    say(`  naive ${row.naive_s.toFixed(1)} s wall, ${(naiveSliceCpu * scale).toFixed(1)} s CPU (measured ${naiveSlice_s.toFixed(3)} s on a ${sliceDays}-day slice, scaled x${scale.toFixed(2)} to the span)`);
    say(`  ratio naive/fast ${row.ratio.toFixed(0)} (CPU ${((naiveSliceCpu * scale) / fastCpu).toFixed(0)})  max relative L1 deviation on the slice ${(dev * 100).toFixed(3)}%`);
    say(`  goals: ratio >= 20 ${row.ratio >= 20 ? 'met' : 'NOT met'}, deviation <= 0.5% ${dev <= 0.005 ? 'met' : 'NOT met'}, under 3 s ${fast_s < 3 ? 'met' : 'NOT met'} (CPU ${fastCpu < 3 ? 'under' : 'over'} 3 s)`);
    for (const f of fast!.summary.frequencies) {
      say(`    ${f.mhz} MHz: FWHM ${f.beam?.fwhm_major_deg.toFixed(2)} x ${f.beam?.fwhm_minor_deg.toFixed(2)} deg, ${f.beam?.directivity_dbi.toFixed(2)} dBi, sky covered ${(100 * f.sky_fraction_covered).toFixed(2)}%, exposure max ${f.exposure_max_h.toFixed(1)} h`);
    }
  }
  return { lines, rows };
}

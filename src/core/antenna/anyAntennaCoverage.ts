// Exposure, covered sky, band hours and noise of any antenna at one site
// (everything but the plain zenith dish, which the hit-map path serves): the
// usable time binned by the turn about the pole (spin.ts), per pointing-plan
// segment and frequency, summed over the segments. One stage shared by the
// plan (engine/runPlan.ts) and the site survey's general path (survey.ts), so
// a surveyed site's figures are the plan's by construction.

import type { Scenario, Stage, Track } from '../types';
import { antennaBeam } from './beam';
import type { HorizonFrames } from './frame';
import { sampleSegments, segmentsOf } from './pointing';
import { spinCoverageStage, type SpinJob } from './spin';
import { sysWeightedTrack } from '../sky/noise';
import { noiseWithSky } from '../stats';

export interface AnyAntennaFrequency {
  /** exposure (hours), RING, the map's nside */
  map: Float32Array;
  covered: Uint8Array;
  inBand: number;
  nearCentre: number;
  noise: Float32Array;
  noise_median_k: number;
  /** the reference system temperature of the noise (median T_sys over usable samples), K */
  t_sys_k: number;
}

export interface AnyAntennaCoverage {
  /** one per asked frequency, in the order asked */
  frequencies: AnyAntennaFrequency[];
  /** per plan segment: its maps and covered masks (per asked frequency) and its usable hours */
  segments: { maps: Float64Array[]; covered: Uint8Array[]; hours: number }[];
}

/**
 * The figures of the scenario's frequencies `freqIdx` (indices into
 * telescope.frequencies_mhz); `usable[j]` and `tAntK[j]` are the usable flags
 * and antenna-temperature series of freqIdx[j]. Noise: the radiometer
 * equation with the sky (sky/noise.ts), from the exposure with each sample's
 * hours weighted by (T_ref / T_sys)^2.
 */
export function* anyAntennaCoverageStage(
  s: Scenario, track: Track, frames: HorizonFrames, freqIdx: number[], usable: Uint8Array[], tAntK: Float32Array[],
  sens: { bandwidth_mhz: number; receiver_temp_k: number },
  opts: { noise?: boolean } = {},
): Stage<AnyAntennaCoverage> {
  const wantNoise = opts.noise ?? true;
  const nside = s.map.nside, npix = 12 * nside * nside;
  const band = s.map.galactic_band_deg, centre = s.map.galactic_center_radius_deg;
  const segs = segmentsOf(s);
  const segOf = sampleSegments(track, segs);
  const nf = freqIdx.length;
  const jobs: SpinJob[] = [];
  for (let g = 0; g < segs.length; g++)
    for (let j = 0; j < nf; j++) {
      const u = usable[j];
      jobs.push({ beam: antennaBeam(s, s.telescope.frequencies_mhz[freqIdx[j]], g), pick: (i: number) => u[i] === 1 && segOf[i] === g });
    }
  const share = 1 / (1 + (wantNoise ? nf : 0));
  const sp = spinCoverageStage(track, frames, jobs, nside, band, centre);
  let r = sp.next();
  while (!r.done) { yield share * r.value; r = sp.next(); }
  const spun = r.value;
  const acc = freqIdx.map(() => new Float64Array(npix));
  const cov = freqIdx.map(() => new Uint8Array(npix));
  const inBand = new Float64Array(nf), nearCentre = new Float64Array(nf);
  const segments: AnyAntennaCoverage['segments'] = [];
  for (let g = 0; g < segs.length; g++) {
    const maps: Float64Array[] = [], covered: Uint8Array[] = [];
    let hours = 0;
    for (let j = 0; j < nf; j++) {
      const o = spun[g * nf + j];
      const a = acc[j], c = cov[j];
      for (let q = 0; q < npix; q++) { a[q] += o.map[q]; c[q] |= o.covered[q]; }
      inBand[j] += o.inBand; nearCentre[j] += o.nearCentre;
      hours = Math.max(hours, o.hours);
      maps.push(o.map); covered.push(o.covered);
    }
    segments.push({ maps, covered, hours });
  }
  const frequencies: AnyAntennaFrequency[] = [];
  for (let j = 0; j < nf; j++) {
    if (!wantNoise) {
      frequencies.push({ map: Float32Array.from(acc[j]), covered: cov[j], inBand: inBand[j], nearCentre: nearCentre[j], noise: new Float32Array(0), noise_median_k: NaN, t_sys_k: NaN });
      continue;
    }
    const wt = sysWeightedTrack(track, tAntK[j], sens.receiver_temp_k, usable[j]);
    const sw = spinCoverageStage(wt.track, frames, jobs.filter((_, q) => q % nf === j), nside, band, centre);
    let rw = sw.next();
    while (!rw.done) { yield share * (1 + j + rw.value); rw = sw.next(); }
    const accW = new Float64Array(npix);
    for (const o of rw.value) for (let q = 0; q < npix; q++) accW[q] += o.map[q];
    const noise = noiseWithSky(Float32Array.from(accW), cov[j], wt.tRefK, sens.bandwidth_mhz);
    frequencies.push({
      map: Float32Array.from(acc[j]), covered: cov[j], inBand: inBand[j], nearCentre: nearCentre[j],
      noise: noise.noise, noise_median_k: noise.noise_median_k, t_sys_k: wt.tRefK,
    });
  }
  return { frequencies, segments };
}

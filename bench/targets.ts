// Targets benchmark (issue 12 item 5): two years at a 10-minute step (about
// 105,000 samples), 32 targets spread over the sky, four frequencies, for a
// dish and for a dipole over ground, measured in one run:
//   stage  = targetFiguresStage over every sample (CPU time: the machine may be shared);
//   per unit = that time per sample x target x frequency;
//   points = the same figures from the beam's power at each sample's start
//            only (no following through the interval), as a plain reference:
//            ratio = points time / stage time, and the largest relative
//            difference of the exposure between the two (targets with at
//            least 1 h of exposure).

import type { Scenario } from '../src/core/types';
import { drain } from '../src/core/types';
import { computeTrack } from '../src/core/ephemeris';
import { antennaBeam, horizonFrames } from '../src/core/antenna';
import { targetFiguresStage } from '../src/core/targets/figures';
import { targetPosition } from '../src/core/targets/position';
import { usableMask } from '../src/core/usable';

const DAY_MS = 86_400_000;
const iso = (ms: number) => new Date(ms).toISOString().replace('.000Z', 'Z');
const T0 = Date.UTC(2031, 0, 1);

function scenario(name: string, telescope: Scenario['telescope']): Scenario {
  return {
    format: 'swathe.scenario/1',
    name,
    site: { body: 'moon', lat_deg: -23.5, lon_deg: 171 },
    span: { start: iso(T0), end: iso(T0 + 730 * DAY_MS), step_min: 10 },
    telescope,
    constraints: { sun_max_elev_deg: 0, earth_max_elev_deg: 0, horizon_mask: null },
    map: { nside: 64, galactic_band_deg: 10, galactic_center_radius_deg: 20 },
    targets: Array.from({ length: 32 }, (_, i) => ({ name: `T${i}`, ra_deg: (i * 11.25) % 360, dec_deg: -40 + (i % 5) * 8 })),
  };
}

/** Invented instruments (no real observatory). */
const CASES = [
  scenario('invented far-side dish, 400 m, 4-32 MHz', { aperture_m: 400, frequencies_mhz: [4, 8, 16, 32], beam: { model: 'gaussian', fwhm_factor: 1.15 } }),
  scenario('invented dipole 15 m, 5 m over ground, 4-32 MHz', { frequencies_mhz: [4, 8, 16, 32], beam: { model: 'dipole', fwhm_factor: 1.15, length_m: 15, height_m: 5, axis_azimuth_deg: 90 } }),
];

const cpu = () => { const u = process.cpuUsage(); return (u.user + u.system) / 1e6; };

export async function benchTargets(log: (l: string) => void): Promise<{ name: string; samples: number; stage_cpu_s: number; per_unit_us: number; ratio: number; max_rel_dev: number }[]> {
  const out = [];
  for (const s of CASES) {
    const track = computeTrack(s, { mode: 'fast' });
    const frames = horizonFrames(track, s.site.lon_deg);
    const usable = usableMask(track, s.constraints);
    const freqs = s.telescope.frequencies_mhz;
    const beams = freqs.map((f) => [antennaBeam(s, f)]);
    const targets = s.targets!.map(targetPosition);
    const tAnt = freqs.map(() => new Float32Array(track.n).fill(1000));
    const c0 = cpu();
    const res = drain(targetFiguresStage({ targets, track, frames, beams, segOf: null, usableByFreq: freqs.map(() => usable), tAnt, receiverK: 100, bandwidthMHz: 1 }));
    const stage = cpu() - c0;
    // reference: the beam's summed power at each sample's start
    const c1 = cpu();
    const F = new Float64Array(9);
    const ref = targets.map(() => new Float64Array(freqs.length));
    for (let i = 0; i < track.n; i++) {
      if (!usable[i]) continue;
      frames.at(i, F);
      for (let j = 0; j < targets.length; j++) {
        const v = targets[j].vec;
        const x = F[0] * v[0] + F[1] * v[1] + F[2] * v[2], y = F[3] * v[0] + F[4] * v[1] + F[5] * v[2], z = F[6] * v[0] + F[7] * v[1] + F[8] * v[2];
        for (let k = 0; k < freqs.length; k++) ref[j][k] += track.weight_h[i] * beams[k][0].power(x, y, z);
      }
    }
    const points = cpu() - c1;
    let dev = 0;
    res.forEach((t, j) => t.frequencies.forEach((f, k) => { if (ref[j][k] >= 1) dev = Math.max(dev, Math.abs(f.exposure_h / ref[j][k] - 1)); }));
    const units = track.n * targets.length * freqs.length;
    const row = { name: s.name, samples: track.n, stage_cpu_s: stage, per_unit_us: (stage / units) * 1e6, ratio: points / stage, max_rel_dev: dev };
    log(`targets: ${s.name}: ${track.n} samples x ${targets.length} targets x ${freqs.length} frequencies: stage ${stage.toFixed(2)} s CPU (${row.per_unit_us.toFixed(3)} µs per unit); sample-start reference ${points.toFixed(2)} s (ratio ${row.ratio.toFixed(2)}); exposure differs by at most ${(dev * 100).toFixed(2)}%`);
    out.push(row);
  }
  return out;
}

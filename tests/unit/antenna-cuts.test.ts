import { describe, expect, it } from 'vitest';
import { parseScenario } from '../../src/core/scenario';
import { principalCuts, skyBeamAt } from '../../src/core/antenna/cuts';
import { computeTrack } from '../../src/core/ephemeris';
import type { Scenario } from '../../src/core/types';

// Principal-plane cuts for the beam view and the half-power outline on the
// sky map, against patterns written out here from their textbook forms (not
// through the project's model code).

const C = 299.792458; // speed of light, m/us: lambda (m) = C / f (MHz)
const DEG = Math.PI / 180;

function scen(tel: Record<string, unknown>, extra: Record<string, unknown> = {}): Scenario {
  const r = parseScenario({
    format: 'swathe.scenario/1', name: 'invented cut test',
    site: { body: 'moon', lat_deg: -20, lon_deg: 150 },
    span: { start: '2031-01-01T00:00:00Z', end: '2031-01-03T00:00:00Z', step_min: 60 },
    telescope: { frequencies_mhz: [10], ...tel },
    map: { nside: 16 },
    ...extra,
  });
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  return r.scenario;
}

const at = (cut: { angleDeg: Float64Array; db: Float64Array }, deg: number) => cut.db[cut.angleDeg.findIndex((a) => Math.abs(a - deg) < 1e-9)];

describe('principal-plane cuts', () => {
  const lambda = C / 10;
  it('half-wave dipole in free space: E-plane [cos(pi/2 sin t)/cos t]^2, H-plane flat (Balanis, Antenna Theory, 3rd ed., eq. 4-84)', () => {
    const [e, h] = principalCuts(scen({ beam: { model: 'dipole', length_m: lambda / 2, height_m: null, axis_azimuth_deg: 90 } }), 10);
    expect(e.azimuthDeg).toBeCloseTo(90, 9);
    for (const t of [-80, -60, -39, -20, 0, 10, 45, 70]) {
      const r = t * DEG;
      const want = 10 * Math.log10((Math.cos((Math.PI / 2) * Math.sin(r)) / Math.cos(r)) ** 2);
      expect(at(e, t)).toBeCloseTo(want, 6);
      expect(at(h, t)).toBeCloseTo(0, 6);
    }
    // E-plane half-power width 78 degrees (Balanis, sec. 4.6)
    expect(e.fwhmDeg).toBeCloseTo(78, 0);
  });

  it('half-wave dipole a quarter wavelength over a perfect ground: times sin^2(pi/2 cos t) (image theory, Balanis sec. 4.7)', () => {
    const [e, h] = principalCuts(scen({ beam: { model: 'dipole', length_m: lambda / 2, height_m: lambda / 4, axis_azimuth_deg: 90 } }), 10);
    for (const t of [-75, -40, -10, 0, 25, 60, 85]) {
      const r = t * DEG;
      const af = Math.sin((Math.PI / 2) * Math.cos(r)) ** 2;
      expect(at(h, t)).toBeCloseTo(10 * Math.log10(af), 5);
      expect(at(e, t)).toBeCloseTo(10 * Math.log10(af * (Math.cos((Math.PI / 2) * Math.sin(r)) / Math.cos(r)) ** 2), 5);
    }
  });

  it('elliptical Gaussian: -10 log10(e) 4 ln2 (t/F)^2 along each side, F = k lambda / size (ARCHITECTURE.md section 6; common practice)', () => {
    const [a, b] = principalCuts(scen({ beam: { model: 'elliptical_gaussian', length_m: 300, width_m: 60, fwhm_factor: 1.2, axis_azimuth_deg: 30 } }), 10);
    const FL = (1.2 * lambda) / 300 / DEG, FW = (1.2 * lambda) / 60 / DEG; // degrees
    expect(a.azimuthDeg).toBeCloseTo(30, 9);
    expect(b.azimuthDeg).toBeCloseTo(120, 9);
    for (const t of [-8, -3, 0, 2, 5]) {
      expect(at(a, t)).toBeCloseTo(-10 * Math.log10(Math.E) * 4 * Math.LN2 * (t / FL) ** 2, 6);
    }
    for (const t of [-20, -10, 0, 15]) {
      expect(at(b, t)).toBeCloseTo(-10 * Math.log10(Math.E) * 4 * Math.LN2 * (t / FW) ** 2, 6);
    }
    expect(a.fwhmDeg).toBeCloseTo(FL, 3);
    expect(b.fwhmDeg).toBeCloseTo(FW, 3);
  });
});

const angle = (p: ArrayLike<number>, o: number, q: ArrayLike<number>, r = 0) =>
  Math.acos(Math.max(-1, Math.min(1, p[o] * q[r] + p[o + 1] * q[r + 1] + p[o + 2] * q[r + 2]))) / DEG;

describe('half-power outline on the sky', () => {
  it('circular Gaussian at the zenith: every point FWHM/2 = k lambda / (2 D) from the zenith', () => {
    const s = scen({ aperture_m: 200, beam: { model: 'gaussian', fwhm_factor: 1.15 } });
    const track = computeTrack(s);
    const i = 7;
    const z = [track.zx[i], track.zy[i], track.zz[i]];
    const b = skyBeamAt(s, track, i, 10);
    expect(b.outlines).toHaveLength(1);
    const half = (1.15 * (C / 10)) / 200 / DEG / 2;
    for (let k = 0; k < b.outlines[0].length; k += 3) expect(angle(b.outlines[0], k, z)).toBeCloseTo(half, 3);
    expect(angle(b.boresights[0], 0, z)).toBeLessThan(1e-6);
  });

  it('fan beam tilted to elevation 60 with an extra feed: boresight 30 deg from the zenith, outline from F_W/2 to F_L/2 around it', () => {
    const s = scen({ beam: { model: 'elliptical_gaussian', length_m: 300, width_m: 60, fwhm_factor: 1.15, axis_azimuth_deg: 0 }, pointing: { elevation_deg: 60, azimuth_deg: 180 }, feeds: [{ x_offset_deg: 10, y_offset_deg: 0 }] });
    const track = computeTrack(s);
    const i = 20;
    const z = [track.zx[i], track.zy[i], track.zz[i]];
    const b = skyBeamAt(s, track, i, 10);
    expect(b.outlines).toHaveLength(2);
    expect(angle(b.boresights[0], 0, z)).toBeCloseTo(30, 6);
    // the extra feed sits atan(tan 10 deg) = 10 deg from the main boresight
    expect(angle(b.boresights[1], 0, b.boresights[0])).toBeCloseTo(10, 6);
    const FL = (1.15 * (C / 10)) / 300 / DEG, FW = (1.15 * (C / 10)) / 60 / DEG;
    const d: number[] = [];
    for (let k = 0; k < b.outlines[0].length; k += 3) d.push(angle(b.outlines[0], k, b.boresights[0]));
    expect(Math.max(...d)).toBeCloseTo(FW / 2, 2);
    expect(Math.min(...d)).toBeCloseTo(FL / 2, 2);
  });
});

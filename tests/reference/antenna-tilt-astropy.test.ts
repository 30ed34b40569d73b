import { execFileSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { PY, requirePython } from './pythonRef';
import { parseScenario } from '../../src/core/scenario';
import { antennaBeam, horizonFrames, localToJ2000 } from '../../src/core/antenna';
import { computeTrack } from '../../src/core/ephemeris';
import type { Scenario } from '../../src/core/types';

// An Earth dish tilted to elevation e at azimuth 0 or 180 sweeps declination
// latitude +/- (90 - e) (common practice); checked against astropy's
// AltAz -> ICRS (no refraction) at several instants, for an invented site.
const hasAstropy = requirePython(['astropy.coordinates'], 'the tilted-dish boresight check');
const LAT = 38.2, LON = -101.7;
const POINTINGS = [{ elevation_deg: 60, azimuth_deg: 0 }, { elevation_deg: 45, azimuth_deg: 180 }, { elevation_deg: 70, azimuth_deg: 90 }];

describe('tilted Earth dish boresight against astropy AltAz -> ICRS', () => {
  it.skipIf(!hasAstropy)('agrees within 0.01 deg at 6 instants for 3 pointings; meridian tilts sit at dec = lat +/- (90 - e)', () => {
    const s0 = (parseScenario({
      format: 'swathe.scenario/1', site: { body: 'earth', lat_deg: LAT, lon_deg: LON },
      span: { start: '2031-03-01T00:00:00Z', end: '2031-03-02T00:00:00Z', step_min: 240 },
      telescope: { aperture_m: 20, frequencies_mhz: [1400] },
    }) as { scenario: Scenario }).scenario;
    const tr = computeTrack(s0);
    const fr = horizonFrames(tr, LON);
    const times = Array.from({ length: tr.n }, (_, i) => new Date(tr.t0_ms + i * tr.step_min * 60_000).toISOString());
    const py = `
import json
from astropy.utils import iers
iers.conf.auto_download = False
iers.conf.auto_max_age = None
from astropy.coordinates import SkyCoord, EarthLocation, AltAz, ICRS
from astropy.time import Time
import astropy.units as u
loc = EarthLocation.from_geodetic(${LON}*u.deg, ${LAT}*u.deg, 0*u.m)
out = []
for p in ${JSON.stringify(POINTINGS.map((p) => [p.elevation_deg, p.azimuth_deg]))}:
    row = []
    for t in ${JSON.stringify(times)}:
        c = SkyCoord(alt=p[0]*u.deg, az=p[1]*u.deg, frame=AltAz(obstime=Time(t), location=loc, pressure=0*u.hPa)).transform_to(ICRS())
        row.append([c.ra.deg, c.dec.deg])
    out.append(row)
print(json.dumps(out))
`;
    const want = JSON.parse(execFileSync(PY, ['-c', py], { encoding: 'utf8', timeout: 300_000 })) as number[][][];
    const f = new Float64Array(9), v = new Float64Array(3);
    POINTINGS.forEach((p, j) => {
      const s = { ...s0, telescope: { ...s0.telescope, pointing: p } };
      const b = antennaBeam(s, 1400).boresights[0];
      for (let i = 0; i < tr.n; i++) {
        fr.at(i, f);
        localToJ2000(f, b[0], b[1], b[2], v);
        const [ra, dec] = want[j][i];
        const w = [Math.cos((dec * Math.PI) / 180) * Math.cos((ra * Math.PI) / 180), Math.cos((dec * Math.PI) / 180) * Math.sin((ra * Math.PI) / 180), Math.sin((dec * Math.PI) / 180)];
        const sep = (Math.acos(Math.min(1, v[0] * w[0] + v[1] * w[1] + v[2] * w[2])) * 180) / Math.PI;
        expect(sep, `pointing ${j}, sample ${i}`).toBeLessThan(0.01);
        if (p.azimuth_deg === 0) expect(Math.abs(dec - (LAT + 90 - p.elevation_deg))).toBeLessThan(0.3); // the rule holds in the equator of date; ICRS differs by precession (~0.17 deg by 2031)
        if (p.azimuth_deg === 180) expect(Math.abs(dec - (LAT - 90 + p.elevation_deg))).toBeLessThan(0.3);
      }
    });
  }, 300_000);
});

import { execFileSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { PY, requirePython } from './pythonRef';
import { parseScenario } from '../../src/core/scenario';
import { beamFiguresFor } from '../../src/core/antenna';
import type { Scenario } from '../../src/core/types';

// A horizontal dipole over a perfectly conducting ground (image theory,
// Balanis, Antenna Theory, 3rd ed., sec. 4.7): its directivity integrated
// numerically by scipy.integrate.dblquad under /usr/bin/python3, written here
// from the formula (eq. 4-62a times the array factor 2 sin(kh cos theta)),
// independent of the project's code: D = 4 pi max(U) / integral of U over the
// upper hemisphere.
const CASES = [
  { l: 0.5, h: 0.25 },
  { l: 0.5, h: 0.1 },
  { l: 0.1, h: 0.5 },
];

const script = `
import numpy as np, json, sys
from scipy.integrate import dblquad
out = []
for l, h in ${JSON.stringify(CASES.map((c) => [c.l, c.h]))}:
    k = 2*np.pi
    def U(th, ph):
        # dipole along x (east); cos psi = sin th cos ph
        c = np.sin(th)*np.cos(ph)
        s = np.sqrt(max(1 - c*c, 1e-30))
        e = (np.cos(k*l/2*c) - np.cos(k*l/2))/s
        return (e*2*np.sin(k*h*np.cos(th)))**2
    tot, _ = dblquad(lambda th, ph: U(th, ph)*np.sin(th), 0, 2*np.pi, 0, np.pi/2, epsabs=1e-10, epsrel=1e-8)
    ths = np.linspace(0, np.pi/2, 901); phs = np.linspace(0, 2*np.pi, 1441)
    mx = max(U(t, p) for t in ths[::10] for p in phs[::20])
    from scipy.optimize import minimize
    best = minimize(lambda v: -U(v[0], v[1]), x0=[0.01, np.pi/2], method='Nelder-Mead', options={'xatol':1e-10,'fatol':1e-14})
    mx = max(mx, -best.fun)
    out.append(10*np.log10(4*np.pi*mx/tot))
print(json.dumps(out))
`;

describe('horizontal dipole over a perfect ground: directivity against scipy (Balanis sec. 4.7, image theory)', () => {
  const ok = requirePython(['scipy', 'numpy'], 'the dipole-over-ground directivity check');
  it.skipIf(!ok)('matches scipy.integrate.dblquad within 0.05 dB', () => {
    const want = JSON.parse(execFileSync(PY, ['-c', script], { encoding: 'utf8', timeout: 300_000 })) as number[];
    CASES.forEach((c, i) => {
      const lambda = 299.792458 / 20;
      const s = (parseScenario({
        format: 'swathe.scenario/1', site: { body: 'moon', lat_deg: 0, lon_deg: 0 },
        span: { start: '2031-01-01T00:00:00Z', end: '2031-01-02T00:00:00Z' },
        telescope: { frequencies_mhz: [20], beam: { model: 'dipole', length_m: c.l * lambda, height_m: c.h * lambda, axis_azimuth_deg: 90 } },
      }) as { scenario: Scenario }).scenario;
      const got = beamFiguresFor(s, 20).directivity_dbi;
      expect(Math.abs(got - want[i]), `l=${c.l} lambda, h=${c.h} lambda: ours ${got} dBi, scipy ${want[i]} dBi`).toBeLessThan(0.05);
    });
  }, 300_000);
});

import { describe, expect, it } from 'vitest';
import { parseScenario, scenarioToJson, parseScenarioJson } from '../../src/core/scenario';
import { skyModelFor, type LoadedSkyMap } from '../../src/core/sky/model';
import type { HealpixMap } from '../../src/core/sky/fitsMap';
import { pix2vecRing } from '../../src/core/healpix';

// The `sky` field of swathe.scenario/1 (ARCHITECTURE.md section 6) and the one
// interface over its three models. Expected values are the stated formulas
// written out here by hand.

function base(sky?: unknown): Record<string, unknown> {
  return {
    format: 'swathe.scenario/1',
    site: { body: 'moon', lat_deg: 0, lon_deg: 0 },
    span: { start: '2031-01-01T00:00:00Z', end: '2031-01-02T00:00:00Z' },
    telescope: { aperture_m: 500, frequencies_mhz: [10] },
    ...(sky !== undefined ? { sky } : {}),
  };
}

function msgs(sky: unknown): string[] {
  const r = parseScenario(base(sky));
  return r.ok ? [] : r.issues.map((i) => i.message);
}

describe('sky field', () => {
  it('is optional and kept only when given (absent means the galaxy model)', () => {
    const r = parseScenario(base());
    expect(r.ok && r.scenario.sky).toBe(undefined);
    const g = parseScenario(base({}));
    expect(g.ok && g.scenario.sky).toEqual({ model: 'galaxy' });
  });

  it('round-trips the map model through canonical JSON', () => {
    const sky = { model: 'map', maps: [{ file: 'maps/sky408.fits', frequency_mhz: 408 }], spectral_index: -2.55, ground_temp_k: 250 };
    const r = parseScenario(base(sky));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.scenario.sky).toEqual(sky);
    const again = parseScenarioJson(scenarioToJson(r.scenario));
    expect(again.ok && again.scenario.sky).toEqual(sky);
  });

  it('names the field and the allowed range for each bad value', () => {
    expect(msgs({ model: 'haslam' })).toEqual(['sky.model must be one of "galaxy", "uniform", "map", got "haslam"']);
    expect(msgs({ model: 'uniform', ground_temp_k: -3 })).toEqual(['sky.ground_temp_k must be between 0 and 10000, got -3']);
    expect(msgs({ model: 'map' })[0]).toMatch(/^sky\.maps must be a list of 1 to 8 maps .* got nothing$/);
    expect(msgs({ model: 'map', maps: [{ file: 'a.fits', frequency_mhz: 408 }] })[0]).toMatch(/^sky\.spectral_index is required with one map/);
    expect(msgs({ model: 'map', maps: [{ file: 'a.fits', frequency_mhz: 408 }], spectral_index: -9 })).toEqual(['sky.spectral_index must be between -5 and 1, got -9']);
    expect(msgs({ model: 'map', maps: [{ file: '', frequency_mhz: 408 }], spectral_index: -2.5 })[0]).toMatch(/^sky\.maps\[0\]\.file must be a file name/);
    expect(msgs({ model: 'map', maps: [{ file: 'a.fits', frequency_mhz: 0 }], spectral_index: -2.5 })).toEqual(['sky.maps[0].frequency_mhz must be between 0.001 and 100000, got 0']);
    expect(msgs({ model: 'map', maps: [{ file: 'a.fits', frequency_mhz: 45 }, { file: 'b.fits', frequency_mhz: 45 }] })[0]).toMatch(/^sky\.maps\[1\]\.frequency_mhz repeats 45 MHz/);
    expect(msgs({ model: 'map', maps: [{ file: 'a.fits', frequency_mhz: 45 }, { file: 'b.fits', frequency_mhz: 408 }], spectral_index: -2.5 })[0]).toMatch(/^sky\.spectral_index applies to a single map/);
    expect(msgs({ model: 'uniform', spectral_index: -2.5 })[0]).toMatch(/^sky\.spectral_index belongs to the map model/);
    expect(msgs({ model: 'galaxy', colour: 1 })[0]).toMatch(/^sky\.colour is not a known field/);
  });
});

function fakeMap(nside: number, coordsys: 'G' | 'C' | 'E', f: (v: [number, number, number]) => number): HealpixMap {
  const values = new Float32Array(12 * nside * nside);
  for (let p = 0; p < values.length; p++) values[p] = f(pix2vecRing(nside, p));
  return { nside, values, coordsys, fileNside: nside, ordering: 'RING', unit: 'K', column: 'T' };
}

describe('sky models behind one interface', () => {
  const T_CMB = 2.7255; // Fixsen 2009

  it('one map scales T - T_CMB with the spectral index (the stated formula)', () => {
    const m = fakeMap(8, 'G', () => 40);
    const model = skyModelFor({ model: 'map', maps: [{ file: 'a.fits', frequency_mhz: 408 }], spectral_index: -2.55 }, [{ file: 'a.fits', frequency_mhz: 408, map: m }]);
    const want = (40 - T_CMB) * Math.pow(50 / 408, -2.55) + T_CMB;
    expect(model.at(50).atGalactic(0, 0, 1)).toBeCloseTo(want, 2);
    expect(model.at(50).atGalactic(0, 0, 1) / want - 1).toBeLessThan(1e-6);
  });

  it('two maps: per-pixel power law in T - T_CMB between the two nearest in frequency', () => {
    // pixel-dependent index: excess 100 K at 45 MHz, 100 (408/45)^b(p) at 408 MHz with b = -2.3 - 0.4 z
    const idx = (v: number[]) => -2.3 - 0.4 * v[2];
    const lo = fakeMap(8, 'C', () => 100 + T_CMB);
    const hi = fakeMap(8, 'C', (v) => 100 * Math.pow(408 / 45, idx(v)) + T_CMB);
    const far = fakeMap(8, 'C', () => 3); // 1420 MHz: not one of the two nearest to 150 MHz
    const maps: LoadedSkyMap[] = [
      { file: 'a.fits', frequency_mhz: 45, map: lo }, { file: 'c.fits', frequency_mhz: 1420, map: far }, { file: 'b.fits', frequency_mhz: 408, map: hi },
    ];
    const model = skyModelFor({ model: 'map', maps: maps.map((m) => ({ file: m.file, frequency_mhz: m.frequency_mhz })) }, maps);
    const g = model.at(150);
    for (const p of [0, 100, 383, 700]) {
      const v = pix2vecRing(8, p);
      const want = 100 * Math.pow(150 / 45, idx(v)) + T_CMB;
      expect(Math.abs(g.values[p] / want - 1)).toBeLessThan(2e-6);
    }
  });

  it('looks a galactic map up from J2000 directions (the galactic north pole at RA 192.85948, Dec 27.12825, IAU)', () => {
    const m = fakeMap(32, 'G', (v) => 10 + 5 * v[2]);
    const model = skyModelFor({ model: 'map', maps: [{ file: 'a.fits', frequency_mhz: 100 }], spectral_index: 0 }, [{ file: 'a.fits', frequency_mhz: 100, map: m }]);
    const ra = (192.85948 * Math.PI) / 180, dec = (27.12825 * Math.PI) / 180;
    const t = model.at(100).atJ2000(Math.cos(dec) * Math.cos(ra), Math.cos(dec) * Math.sin(ra), Math.sin(dec));
    expect(t).toBeCloseTo(15, 2);
  });

  it('refuses maps that disagree in coordinates or nside, and a map not loaded, naming the file', () => {
    const spec = { model: 'map' as const, maps: [{ file: 'a.fits', frequency_mhz: 45 }, { file: 'b.fits', frequency_mhz: 408 }] };
    const a = fakeMap(8, 'G', () => 1);
    expect(() => skyModelFor(spec, [{ file: 'a.fits', frequency_mhz: 45, map: a }, { file: 'b.fits', frequency_mhz: 408, map: fakeMap(8, 'C', () => 1) }]))
      .toThrow(/b\.fits is in coordinates C but a\.fits is in G/);
    expect(() => skyModelFor(spec, [{ file: 'a.fits', frequency_mhz: 45, map: a }, { file: 'b.fits', frequency_mhz: 408, map: fakeMap(16, 'G', () => 1) }]))
      .toThrow(/b\.fits has nside 16 but a\.fits has nside 8/);
    expect(() => skyModelFor(spec, [{ file: 'a.fits', frequency_mhz: 45, map: a }])).toThrow(/the map b\.fits \(408 MHz\) is not loaded/);
  });

  it('uniform and galaxy answer through the same interface', () => {
    const u = skyModelFor({ model: 'uniform' }).at(10);
    expect(u.atJ2000(0.6, 0.8, 0)).toBe(u.atGalactic(0, 0, 1));
    const g = skyModelFor(undefined).at(30);
    expect(g.atGalactic(1, 0, 0)).toBeGreaterThan(g.atGalactic(0, 0, 1));
  });
});

import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import {
  MAX_ISSUES, SCENARIO_LIMITS, ScenarioError, decodeScenarioParam, describeValue, encodeScenarioParam, formNumber,
  parseScenario, parseScenarioBytes, parseScenarioJson, scenarioToJson, wrapLonDeg,
} from '../../src/core/scenario';
import { DEMO_SCENARIO } from '../../src/core/demo';

// Checks swathe.scenario/1 against its definition in ARCHITECTURE.md §3 (the
// project's public format) and issue 6 item 1 (messages name the field, the
// allowed range and the value got; several problems reported together).

const fixture = (name: string) => readFileSync(new URL(`../fixtures/scenarios/${name}`, import.meta.url), 'utf8');

function minimal(): Record<string, any> {
  return {
    format: 'swathe.scenario/1',
    site: { body: 'moon', lat_deg: 0, lon_deg: 0 },
    span: { start: '2031-01-01T00:00:00Z', end: '2031-01-02T00:00:00Z' },
    telescope: { aperture_m: 500, frequencies_mhz: [10] },
  };
}

function issuesOf(input: unknown) {
  const r = parseScenario(input);
  if (r.ok) throw new Error('expected a validation error');
  return r.issues;
}

function messages(input: unknown): string[] {
  return issuesOf(input).map((i) => i.message);
}

describe('swathe.scenario/1 defaults and normalisation', () => {
  it('fills every optional field with its documented default', () => {
    const r = parseScenario(minimal());
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.scenario).toEqual({
      format: 'swathe.scenario/1',
      name: '',
      site: { body: 'moon', lat_deg: 0, lon_deg: 0 },
      span: { start: '2031-01-01T00:00:00Z', end: '2031-01-02T00:00:00Z', step_min: null },
      telescope: { aperture_m: 500, frequencies_mhz: [10], beam: { model: 'gaussian', fwhm_factor: 1.15 } },
      constraints: { sun_max_elev_deg: 0, earth_max_elev_deg: 0, horizon_mask: null },
      map: { nside: 128, galactic_band_deg: 10, galactic_center_radius_deg: 20 },
    });
  });

  it('defaults earth_max_elev_deg to null for an Earth site and a Mars site (issue 9 item 4: only the Moon defaults to 0)', () => {
    const e = minimal();
    e.site.body = 'earth';
    const r = parseScenario(e);
    expect(r.ok && r.scenario.constraints.earth_max_elev_deg).toBe(null);
    const m = minimal();
    m.site.body = 'mars';
    const rm = parseScenario(m);
    expect(rm.ok && rm.scenario.constraints.earth_max_elev_deg).toBe(null);
  });

  it('fills defaults field by field inside a partly given object', () => {
    const s = minimal();
    s.telescope.beam = { model: 'airy' };
    s.constraints = { sun_max_elev_deg: -12 };
    s.map = { nside: 64 };
    const r = parseScenario(s);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.scenario.telescope.beam).toEqual({ model: 'airy', fwhm_factor: 1.15 });
    expect(r.scenario.constraints).toEqual({ sun_max_elev_deg: -12, earth_max_elev_deg: 0, horizon_mask: null });
    expect(r.scenario.map).toEqual({ nside: 64, galactic_band_deg: 10, galactic_center_radius_deg: 20 });
  });

  it('wraps longitude to [-180, 180) and keeps values already inside bit for bit', () => {
    // ARCHITECTURE.md §3: lon_deg any finite value, normalised to [-180, 180).
    const cases: [number, number][] = [[180, -180], [-180, -180], [540, -180], [190, -170], [-190, 170], [359.5, -0.5], [720, 0], [-0, 0], [1e6, 1e6 % 360 - 360]];
    for (const [input, want] of cases) expect(wrapLonDeg(input)).toBeCloseTo(want, 9);
    for (const x of [-179.99999999999997, 179.99999999999997, 0.1, -42.123456789]) expect(wrapLonDeg(x)).toBe(x);
    for (let i = 0; i < 2000; i++) {
      const x = (Math.random() - 0.5) * 1e5;
      const w = wrapLonDeg(x);
      expect(w >= -180 && w < 180).toBe(true);
      expect(Math.abs(Math.sin(((w - x) * Math.PI) / 360))).toBeLessThan(1e-9); // same direction (mod 360)
      expect(wrapLonDeg(w)).toBe(w);
    }
    const s = minimal();
    s.site.lon_deg = 200;
    const r = parseScenario(s);
    expect(r.ok && r.scenario.site.lon_deg).toBe(-160);
  });

  it('accepts the demo and the fixture files unchanged in meaning', () => {
    const d = parseScenario(DEMO_SCENARIO);
    expect(d.ok && d.scenario).toEqual(DEMO_SCENARIO);
    const v = parseScenarioJson(fixture('valid-moon.json'));
    expect(v.ok).toBe(true);
    if (v.ok) {
      expect(v.scenario.site.lon_deg).toBe(-160);
      expect(v.scenario.telescope.frequencies_mhz).toEqual([5, 7.5, 20]);
      expect(v.scenario.constraints.horizon_mask).toEqual([[0, 2], [90, 5.5], [180, 1], [270, 3]]);
    }
    expect(parseScenarioJson(fixture('minimal-earth.json')).ok).toBe(true);
  });
});

describe('round trips', () => {
  it('scenarioToJson then parse gives the same scenario, and the text is stable', () => {
    for (const src of [DEMO_SCENARIO, parseScenarioJson(fixture('valid-moon.json')), parseScenarioJson(fixture('minimal-earth.json'))]) {
      const s = 'ok' in src ? (src.ok ? src.scenario : null) : src;
      expect(s).not.toBe(null);
      const text = scenarioToJson(s!);
      const back = parseScenarioJson(text);
      expect(back.ok && back.scenario).toEqual(s);
      expect(back.ok && scenarioToJson(back.scenario)).toBe(text);
    }
  });

  it('the URL parameter is URL-safe base64url (RFC 4648 §5) and decodes to the same scenario', () => {
    const p = encodeScenarioParam(DEMO_SCENARIO);
    expect(p).toMatch(/^[A-Za-z0-9_-]+$/);
    expect(encodeURIComponent(p)).toBe(p);
    const r = decodeScenarioParam(p);
    expect(r.ok && r.scenario).toEqual(DEMO_SCENARIO);
    // non-ASCII names survive (UTF-8 inside)
    const named = { ...DEMO_SCENARIO, name: 'Krater Süd — 月 🌑' };
    const r2 = decodeScenarioParam(encodeScenarioParam(named));
    expect(r2.ok && r2.scenario.name).toBe(named.name);
  });

  it('a decoded URL gets the same validation as a file', () => {
    const bad = { ...minimal(), site: { body: 'moon', lat_deg: 123, lon_deg: 0 } };
    const p = btoa(JSON.stringify(bad)).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '');
    const r = decodeScenarioParam(p);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0].message).toBe('site.lat_deg must be between -90 and 90, got 123');
    for (const junk of ['', '!!!', 'abc', encodeScenarioParam(DEMO_SCENARIO).slice(0, 50), 'x'.repeat(5_000_000)]) {
      const j = decodeScenarioParam(junk);
      expect(j.ok).toBe(false);
      if (!j.ok) expect(j.issues[0].field).toBe('(url)');
    }
  });
});

describe('messages name the field, the allowed range and the value got', () => {
  it('uses the exact wording of the issue for an out-of-range latitude', () => {
    const s = minimal();
    s.site.lat_deg = 123;
    expect(issuesOf(s)).toEqual([{ field: 'site.lat_deg', message: 'site.lat_deg must be between -90 and 90, got 123' }]);
  });

  it('reports several problems together, in field order', () => {
    const s = minimal();
    s.site.lat_deg = 123;
    s.telescope.aperture_m = -5;
    s.map = { nside: 100 };
    expect(issuesOf(s).map((i) => i.field)).toEqual(['site.lat_deg', 'telescope.aperture_m', 'map.nside']);
  });

  it('names required fields when they are missing', () => {
    const m = messages({ format: 'swathe.scenario/1' });
    expect(m).toEqual([
      'site is required (an object with body, lat_deg, lon_deg)',
      'span is required (an object with start, end and optionally step_min)',
      'telescope is required (an object with aperture_m, frequencies_mhz and optionally beam)',
    ]);
    const s = minimal();
    delete s.site.lat_deg;
    delete s.telescope.frequencies_mhz;
    delete s.format;
    expect(messages(s)).toEqual([
      'format is required (must be "swathe.scenario/1")',
      'site.lat_deg is required (a number between -90 and 90)',
      'telescope.frequencies_mhz is required (a list of 1 to 16 frequencies in MHz, each between 0.001 and 100000)',
    ]);
  });

  it('rejects wrong types, NaN and Infinity with the value shown', () => {
    const s = minimal();
    s.site.lat_deg = '12';
    s.site.lon_deg = Infinity;
    s.telescope.aperture_m = NaN;
    s.telescope.frequencies_mhz = [10, null, -Infinity];
    expect(messages(s)).toEqual([
      'site.lat_deg must be a number between -90 and 90, got "12"',
      'site.lon_deg must be a finite number, got Infinity',
      'telescope.aperture_m must be a number between 1 and 100000, got NaN',
      'telescope.frequencies_mhz[1] must be a number between 0.001 and 100000, got null',
      'telescope.frequencies_mhz[2] must be a number between 0.001 and 100000, got -Infinity',
    ]);
  });

  it('unknown fields are errors naming the field, at every level', () => {
    const s = minimal();
    s.colour = 'red';
    s.site.altitude_m = 3;
    s.telescope.beam = { model: 'gaussian', taper: 1 };
    expect(issuesOf(s).map((i) => i.field)).toEqual(['colour', 'site.altitude_m', 'telescope.beam.taper']);
    expect(issuesOf(s)[1].message).toBe('site.altitude_m is not a known field (known: body, lat_deg, lon_deg)');
  });

  it('checks the times strictly (UTC ISO 8601 ending in Z) and the order', () => {
    const bad = ['2031-01-01', '2031-01-01T00:00:00', '2031-01-01 00:00:00Z', '2031-02-30T00:00:00Z', '2031-01-01T24:00:00Z', '2031-01-01T00:00:00+01:00', 'tomorrow', '0050-01-01T00:00:00Z', '2300-01-01T00:00:00Z'];
    for (const t of bad) {
      const s = minimal();
      s.span.start = t;
      const iss = issuesOf(s);
      expect(iss[0].field).toBe('span.start');
      expect(iss[0].message).toContain(JSON.stringify(t));
    }
    const s = minimal();
    s.span.end = s.span.start;
    expect(messages(s)).toEqual(['span.end must be after span.start (2031-01-01T00:00:00Z), got "2031-01-01T00:00:00Z"']);
    const ok = minimal();
    ok.span.end = '2031-01-01T00:00:00.5Z';
    expect(parseScenario(ok).ok).toBe(true);
  });

  it('bounds the frequency list and each frequency, and rejects repeats', () => {
    const count = (n: number) => ({ ...minimal(), telescope: { aperture_m: 500, frequencies_mhz: Array.from({ length: n }, (_, i) => 10 + i) } });
    expect(messages(count(0))).toEqual(['telescope.frequencies_mhz must have 1 to 16 frequencies, got 0']);
    expect(messages(count(17))).toEqual(['telescope.frequencies_mhz must have 1 to 16 frequencies, got 17']);
    expect(parseScenario(count(16)).ok).toBe(true);
    expect(messages(count(1_000_000))).toEqual(['telescope.frequencies_mhz must have 1 to 16 frequencies, got 1000000']);
    const s = minimal();
    s.telescope.frequencies_mhz = [0.0005, 100001, 10, 10];
    expect(messages(s)).toEqual([
      'telescope.frequencies_mhz[0] must be between 0.001 and 100000, got 0.0005',
      'telescope.frequencies_mhz[1] must be between 0.001 and 100000, got 100001',
      'telescope.frequencies_mhz[3] repeats 10 MHz (already at [2]); give each frequency once',
    ]);
  });

  it('refuses a beam wider than the beam models allow, saying what aperture would do', () => {
    const s = minimal();
    s.telescope.aperture_m = 10;
    s.telescope.frequencies_mhz = [3];
    // lambda = 99.93 m at 3 MHz; FWHM = 1.15 * 99.93 / 10 rad = 658 degrees
    const m = messages(s);
    expect(m).toHaveLength(1);
    expect(m[0]).toMatch(/^telescope\.aperture_m of 10 m gives a beam 658 degrees wide \(FWHM\) at 3 MHz; the beam models need at most 90 degrees: use an aperture of at least 73\.2 m/);
  });

  it('nside must be a power of two from 8 to 1024', () => {
    for (const n of [8, 16, 1024]) expect(parseScenario({ ...minimal(), map: { nside: n } }).ok).toBe(true);
    for (const n of [4, 100, 2048, 128.5, '128', null]) {
      expect(messages({ ...minimal(), map: { nside: n } })).toEqual([
        `map.nside must be a power of two between 8 and 1024 (8, 16, 32, ..., 1024), got ${describeValue(n)}`,
      ]);
    }
  });

  it('earth_max_elev_deg must be null for an Earth site', () => {
    const s = minimal();
    s.site.body = 'earth';
    s.constraints = { earth_max_elev_deg: 0 };
    expect(messages(s)).toEqual(['constraints.earth_max_elev_deg must be null for a site on the Earth, got 0']);
    s.constraints = { earth_max_elev_deg: null };
    expect(parseScenario(s).ok).toBe(true);
  });

  it('checks horizon mask points: pairs, ranges, increasing azimuth, bounded count', () => {
    const withMask = (m: unknown) => ({ ...minimal(), constraints: { horizon_mask: m } });
    expect(parseScenario(withMask([[0, 5], [360, 5]])).ok).toBe(true);
    expect(messages(withMask([]))).toEqual(['constraints.horizon_mask must have 1 to 3600 points (or be null), got 0']);
    expect(messages(withMask(Array.from({ length: 3601 }, (_, i) => [i / 10.01, 0])))).toEqual([
      'constraints.horizon_mask must have 1 to 3600 points (or be null), got 3601',
    ]);
    expect(messages(withMask([[0, 1], [361, 2], [90, -91], [80, 0], [1, 2, 3]]))).toEqual([
      'constraints.horizon_mask[1][0] (azimuth) must be between 0 and 360, got 361',
      'constraints.horizon_mask[2][1] (elevation) must be between -90 and 90, got -91',
      'constraints.horizon_mask[3][0] (azimuth) must be greater than the previous point\'s azimuth (90), got 80: list points in increasing azimuth',
      'constraints.horizon_mask[4] must be a pair [azimuth_deg, elevation_deg] like the first point (a rim distance on every point or on none), got a list of 3 items',
    ]);
  });

  it('states the limits it enforces (SCENARIO_LIMITS) and caps the number of messages', () => {
    expect(SCENARIO_LIMITS.nside).toEqual([8, 1024]);
    const s: Record<string, unknown> = minimal();
    for (let i = 0; i < 200; i++) s[`extra${i}`] = i;
    const iss = issuesOf(s);
    // five unknown fields by name, then a count of the rest
    expect(iss.length).toBe(6);
    expect(iss[5]).toEqual({ field: '(input)', message: 'and 195 more problems' });
    const many = issuesOf({ ...minimal(), constraints: { horizon_mask: Array.from({ length: 500 }, () => [400, 0]) } });
    expect(many.length).toBe(MAX_ISSUES + 1);
    expect(many[MAX_ISSUES].message).toMatch(/^and \d+ more problems?$/);
  });
});

describe('hostile and unusual input', () => {
  it('rejects __proto__, constructor and prototype keys without polluting anything', () => {
    const text = '{"format":"swathe.scenario/1","__proto__":{"polluted":1},"site":{"body":"moon","lat_deg":0,"lon_deg":0,"constructor":{"prototype":{"polluted":2}}},' +
      '"span":{"start":"2031-01-01T00:00:00Z","end":"2031-01-02T00:00:00Z"},"telescope":{"aperture_m":500,"frequencies_mhz":[10]}}';
    const r = parseScenarioJson(text);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.issues.map((i) => i.field)).toEqual(['__proto__', 'site.constructor']);
      expect(r.issues[0].message).toBe('__proto__ is a reserved name and not allowed as a field');
    }
    expect(({} as Record<string, unknown>).polluted).toBe(undefined);
    expect(Object.prototype.hasOwnProperty.call(Object.prototype, 'polluted')).toBe(false);
  });

  it('never reads inherited fields, getters or odd objects as data', () => {
    const inherited = Object.create(minimal());
    expect(parseScenario(inherited).ok).toBe(false);
    const s = minimal();
    Object.defineProperty(s.site, 'lat_deg', { get: () => { throw new Error('boom'); }, enumerable: true });
    expect(messages(s)).toContain('site.lat_deg must be plain data, not a computed property');
    const p = new Proxy({}, { ownKeys: () => { throw new Error('trap'); } });
    const r = parseScenario(p);
    expect(r.ok).toBe(false);
    for (const v of [null, undefined, 42, 'text', [], [minimal()], new Date(), new Map(), () => 1, Symbol('s'), 10n]) {
      expect(parseScenario(v).ok).toBe(false);
    }
  });

  it('does not change or keep its input (nothing the user had is overwritten)', () => {
    const s = minimal();
    s.site.lon_deg = 400;
    s.constraints = { horizon_mask: [[0, 1], [10, 2]] };
    const before = structuredClone(s);
    const r = parseScenario(Object.freeze(s));
    expect(s).toEqual(before);
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.scenario.constraints.horizon_mask).not.toBe(s.constraints.horizon_mask);
      expect(r.scenario.site).not.toBe(s.site);
    }
  });

  it('reports bad JSON, empty files, non-UTF-8 bytes and oversized input under (file)', () => {
    const cases: [string | Uint8Array, RegExp][] = [
      ['{"format": "swathe.scenario/1",\n  "site": }', /^\(file\): not valid JSON: .*/],
      ['{\n"a":1,\n}', /^\(file\): not valid JSON: Expected double-quoted property name at line 3, column 1$/],
      ['', /^\(file\): is empty/],
      ['   \n', /^\(file\): is empty/],
      [new Uint8Array([0x7b, 0xff, 0xfe, 0x7d]), /^\(file\): is not UTF-8 text/],
      [new Uint8Array(SCENARIO_LIMITS.text_max_bytes + 1), /^\(file\): a scenario must be at most 2000000 bytes, got 2000001$/],
      ['x'.repeat(SCENARIO_LIMITS.text_max_bytes + 10), /^\(file\): a scenario must be at most/],
    ];
    for (const [input, re] of cases) {
      const r = typeof input === 'string' ? parseScenarioJson(input) : parseScenarioBytes(input);
      expect(r.ok).toBe(false);
      if (!r.ok) {
        expect(r.issues).toHaveLength(1);
        expect(r.issues[0].field).toBe('(file)');
        expect(r.issues[0].message).toMatch(re);
      }
    }
    // a byte-order mark is fine
    expect(parseScenarioJson('\ufeff' + JSON.stringify(minimal())).ok).toBe(true);
  });

  it('names must be printable text of bounded length', () => {
    for (const bad of ['a\u0000b', 'line\nbreak', '\ud800', 'x'.repeat(201), 42]) {
      const iss = issuesOf({ ...minimal(), name: bad });
      expect(iss.map((i) => i.field)).toEqual(['name']);
    }
    expect(parseScenario({ ...minimal(), name: '=HYPERLINK("x") \'quoted\' ünïcödé' }).ok).toBe(true);
  });

  it('ScenarioError lists the issues in its message', () => {
    const e = new ScenarioError([{ field: 'a', message: 'a is bad' }, { field: 'b', message: 'b is bad' }]);
    expect(e.message).toBe('a is bad; b is bad');
    expect(e.name).toBe('ScenarioError');
  });

  it('formNumber turns typed numbers into numbers and keeps other text for the message', () => {
    expect(formNumber(' 12.5 ')).toBe(12.5);
    expect(formNumber('-3e2')).toBe(-300);
    expect(formNumber('12,5')).toBe('12,5');
    expect(formNumber('')).toBe('');
    const s = minimal();
    s.site.lat_deg = formNumber('12,5');
    expect(messages(s)).toEqual(['site.lat_deg must be a number between -90 and 90, got "12,5" (use a point as the decimal separator)']);
  });
});

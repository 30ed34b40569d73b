import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { decodeScenarioParam, parseScenario } from '../../src/core/scenario';
import { parseHorizonCsv } from '../../src/core/horizonCsv';
import { checkBoth, mutatedArb, resultProblems, validScenarioArb } from '../fixtures/scenarios/fuzzKit';

// Property-based tests (issue 6 item 2) of the other two entries: URL-state
// decoding and the horizon-mask CSV. Fixed seed + fresh seed (fuzzKit).

function b64url(text: string): string {
  const bytes = new TextEncoder().encode(text);
  let bin = '';
  for (const b of bytes) bin += String.fromCharCode(b);
  return btoa(bin).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '');
}

function safely<T>(fn: () => T): T | { threw: string } {
  try {
    return fn();
  } catch (e) {
    return { threw: String((e as Error)?.message) };
  }
}

describe('fuzz: URL parameter', () => {
  it('decodes exactly like parsing the same JSON, for valid and mutated scenarios', () => {
    const runs = checkBoth('url-same', fc.property(fc.oneof(validScenarioArb, mutatedArb), (s) => {
      let text: string | undefined;
      try { text = JSON.stringify(s); } catch { return; }
      if (typeof text !== 'string' || text.length > 100_000) return;
      const viaUrl = safely(() => decodeScenarioParam(b64url(text!)));
      expect(resultProblems(viaUrl)).toEqual([]);
      const direct = parseScenario(JSON.parse(text));
      expect((viaUrl as { ok: boolean }).ok).toBe(direct.ok);
      if (direct.ok) expect((viaUrl as { scenario: unknown }).scenario).toEqual(direct.scenario);
    }), 1000);
    expect(runs).toBe(2000);
  });

  it('random, truncated and corrupted parameters fail cleanly under (url)', () => {
    const corrupted = fc.tuple(validScenarioArb, fc.nat(), fc.nat({ max: 10 }), fc.string({ maxLength: 4 })).map(([s, pos, del, ins]) => {
      const p = b64url(JSON.stringify(s));
      const i = pos % (p.length + 1);
      return p.slice(0, i) + ins + p.slice(i + del);
    });
    const runs = checkBoth('url-junk', fc.property(fc.oneof(corrupted, fc.string(), fc.string({ unit: 'binary' }), fc.stringMatching(/^[A-Za-z0-9_-]{0,200}$/)), (p) => {
      const r = safely(() => decodeScenarioParam(p));
      expect(resultProblems(r)).toEqual([]);
      if ('ok' in r && !r.ok) expect(r.issues.every((i) => ['(url)', '(input)'].includes(i.field) || !i.field.startsWith('('))).toBe(true);
    }), 2000);
    expect(runs).toBe(4000);
  });
});

const cellArb = fc.oneof(
  fc.double({ min: -10, max: 370, noNaN: true }).map(String),
  fc.integer({ min: -100, max: 400 }).map(String),
  fc.constantFrom('', 'NaN', 'Infinity', '1e999', '-0', '12,5', 'abc', '#', '"', '\u0000', '\ufffd', '1e-400', '0x10', ' 7 '),
  fc.string({ maxLength: 8 }),
  fc.string({ unit: 'binary', maxLength: 8 }),
);
const lineArb = fc.oneof(
  fc.tuple(cellArb, fc.constantFrom(',', ';', '\t', ' ', '  , '), cellArb).map(([a, s, b]) => a + s + b),
  fc.array(cellArb, { maxLength: 4 }).map((c) => c.join(',')),
  fc.constantFrom('# comment', 'azimuth_deg,elevation_deg', 'az el', '', '   '),
);
const csvArb = fc.oneof(
  fc.array(lineArb, { maxLength: 60 }).chain((ls) => fc.constantFrom('\n', '\r\n', '\r').map((nl) => ls.join(nl))),
  fc.string({ unit: 'binary', maxLength: 400 }),
  fc.uniqueArray(fc.double({ min: 0, max: 360, noNaN: true }), { minLength: 1, maxLength: 200 })
    .map((az) => az.sort((a, b) => a - b).map((a) => `${a},${(a % 30) - 10}`).join('\n')),
);

describe('fuzz: horizon-mask CSV', () => {
  it('gives a mask the scenario accepts, or issues naming a line; never a throw', () => {
    const base = {
      format: 'swathe.scenario/1',
      site: { body: 'moon', lat_deg: 0, lon_deg: 0 },
      span: { start: '2031-01-01T00:00:00Z', end: '2031-01-02T00:00:00Z' },
      telescope: { aperture_m: 500, frequencies_mhz: [10] },
    };
    const runs = checkBoth('csv', fc.property(csvArb, (text) => {
      const r = safely(() => parseHorizonCsv(text));
      expect('threw' in r ? r.threw : '').toBe('');
      if (!('ok' in r)) return;
      if (r.ok) {
        const s = parseScenario({ ...base, constraints: { horizon_mask: r.mask } });
        expect(s.ok && s.scenario.constraints.horizon_mask).toEqual(r.mask);
      } else {
        expect(r.issues.length).toBeGreaterThan(0);
        for (const i of r.issues) {
          expect(i.field).toMatch(/^(line \d+|\(csv\))$/);
          if (i.field !== '(csv)') expect(i.message.startsWith(`${i.field}: `)).toBe(true);
          expect(/[\u0000-\u001f]/.test(i.message)).toBe(false);
        }
      }
    }), 3000);
    expect(runs).toBe(6000);
  });
});

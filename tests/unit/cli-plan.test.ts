import { afterEach, describe, expect, it } from 'vitest';
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../../src/cli/run';
import { PLAN_HELP, planCommand } from '../../src/cli/plan';
import { progressReporter } from '../../src/cli/progress';
import { AtomicFileSet } from '../../src/cli/atomicWrite';
import type { CliIo } from '../../src/cli/io';
import { parseScenario } from '../../src/core/scenario';
import { syntheticResult } from '../fixtures/scenarios/synthetic';
import type { PlanResult, Scenario } from '../../src/core/types';

// The `swathe plan` contract (issue 2 item 6, issue 6 items 1 and 4): exit 0 on
// success; 2 with one line naming the bad field for bad input; 1 with one line
// for other failures; never a stack trace; files written atomically.

const dirs: string[] = [];
afterEach(() => { for (const d of dirs.splice(0)) rmSync(d, { recursive: true, force: true }); });
function tmp(): string {
  const d = mkdtempSync(join(tmpdir(), 'swathe-cli-'));
  dirs.push(d);
  return d;
}

function io(cwd: string, over: Partial<CliIo> = {}) {
  const cap = { out: '', err: '' };
  const value: CliIo = { out: (t) => void (cap.out += t), err: (t) => void (cap.err += t), errIsTTY: false, env: {}, cwd, ...over };
  return { io: value, cap };
}

const GOOD = {
  format: 'swathe.scenario/1',
  name: 'cli fixture',
  site: { body: 'moon', lat_deg: 10, lon_deg: 20 },
  span: { start: '2031-01-01T00:00:00Z', end: '2031-01-01T01:00:00Z', step_min: 10 },
  telescope: { aperture_m: 500, frequencies_mhz: [10, 7.5] },
  map: { nside: 8 },
};

function fakeEngine(make: (s: Scenario) => PlanResult = (s) => syntheticResult(s)) {
  const calls: Scenario[] = [];
  const runPlan = async (s: Scenario, opts?: { onProgress?: (st: string, f: number) => void }) => {
    calls.push(s);
    opts?.onProgress?.('ephemeris', 0.5);
    return make(s);
  };
  return { runPlan, calls };
}

async function runWith(args: string[], files: Record<string, string> = {}, deps = fakeEngine()) {
  const d = tmp();
  for (const [n, t] of Object.entries(files)) writeFileSync(join(d, n), t);
  const { io: i, cap } = io(d);
  let code: number;
  try {
    code = await planCommand(args, i, { runPlan: deps.runPlan });
  } catch (e) {
    // planCommand throws the typed error; runCli turns it into the exit code and line
    code = -1;
    cap.err = (e as Error).message;
  }
  return { code, cap, dir: d };
}

describe('swathe plan: input problems exit 2 with one line naming the field', () => {
  const cases: [string, string[], Record<string, string>, RegExp][] = [
    ['missing file', ['nope.json', '--out', 'o'], {}, /^swathe plan: nope\.json: no such scenario file$/],
    ['bad JSON', ['s.json', '--out', 'o'], { 's.json': '{\n  "format": "swathe.scenario/1",\n  "site": }' }, /^swathe plan: s\.json: not valid JSON: .*/],
    ['empty file', ['s.json', '--out', 'o'], { 's.json': '' }, /^swathe plan: s\.json: is empty/],
    ['validation', ['s.json', '--out', 'o'], { 's.json': JSON.stringify({ ...GOOD, site: { body: 'moon', lat_deg: 123, lon_deg: 0 }, map: { nside: 100 } }) },
      /^swathe plan: s\.json: site\.lat_deg must be between -90 and 90, got 123; map\.nside must be a power of two/],
    ['run limits', ['s.json', '--out', 'o'], { 's.json': JSON.stringify({ ...GOOD, span: { start: '2031-01-01T00:00:00Z', end: '2071-01-01T00:00:00Z', step_min: 0.5 } }) },
      /^swathe plan: s\.json: the run needs 42,076,800 samples: .* set span\.step_min to at least 1\.052 minutes/],
    ['unknown option', ['s.json', '--out', 'o', '--fast'], {}, /^swathe plan: unknown option --fast \(see swathe plan --help\)$/],
    ['missing --out', ['s.json'], {}, /^swathe plan: missing --out DIR/],
    ['--out without value', ['s.json', '--out'], {}, /^swathe plan: option --out needs a value/],
    ['no scenario', ['--out', 'o'], {}, /^swathe plan: missing SCENARIO\.json/],
    ['two scenarios', ['a.json', 'b.json', '--out', 'o'], {}, /^swathe plan: expected one scenario file, got 2/],
    ['--out is a file', ['s.json', '--out', 's.json'], { 's.json': JSON.stringify(GOOD) }, /^swathe plan: --out s\.json: exists and is not a directory$/],
    ['a directory as scenario', ['.', '--out', 'o'], {}, /^swathe plan: \.: is a directory, not a scenario file$/],
    ['not UTF-8', ['s.json', '--out', 'o'], { 's.json': '\u00ff' }, /./],
  ];
  for (const [what, args, files, re] of cases) {
    it(what, async () => {
      const d = tmp();
      for (const [n, t] of Object.entries(files)) writeFileSync(join(d, n), what === 'not UTF-8' ? Buffer.from([0x7b, 0xff, 0x7d]) : t);
      const { io: i, cap } = io(d);
      const engine = fakeEngine();
      // runCli with the real registry would load the real engine; bad input never gets that far
      const code = await runCli(['plan', ...args], i);
      expect(code).toBe(2);
      expect(cap.out).toBe('');
      expect(cap.err.endsWith('\n')).toBe(true);
      expect(cap.err.trimEnd().split('\n')).toHaveLength(1);
      expect(cap.err.trimEnd()).toMatch(what === 'not UTF-8' ? /^swathe plan: s\.json: is not UTF-8 text/ : re);
      expect(cap.err).not.toMatch(/\bat .*\(.*:\d+:\d+\)/); // no stack frames
      expect(engine.calls).toHaveLength(0);
      expect(existsSync(join(d, 'o'))).toBe(false);
    });
  }
});

describe('swathe plan: output', () => {
  it('writes the six files with nothing else left behind', async () => {
    const engine = fakeEngine();
    const { code, cap, dir } = await runWith(['s.json', '--out', 'out/run1'], { 's.json': JSON.stringify(GOOD) }, engine);
    expect([code, cap.err]).toEqual([0, '']);
    const out = join(dir, 'out/run1');
    expect(readdirSync(out).sort()).toEqual(['antenna_temp.csv', 'coverage.csv', 'coverage.fits', 'depth_area.csv', 'summary.json', 'track.csv']);
    expect(engine.calls[0]).toEqual((parseScenario(GOOD) as { scenario: Scenario }).scenario);
    expect(JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8')).format).toBe('swathe.summary/1');
    expect(readFileSync(join(out, 'track.csv'), 'utf8').split('\n')[0]).toBe('utc,ra_deg,dec_deg,l_deg,b_deg,sun_elev_deg,earth_elev_deg,usable');
    expect(readFileSync(join(out, 'coverage.csv'), 'utf8').trimEnd().split('\n')).toHaveLength(1 + 768);
    expect(readFileSync(join(out, 'coverage.fits')).length % 2880).toBe(0);
    expect(cap.out).toMatch(/^wrote .*summary\.json, .*track\.csv, .*coverage\.csv, .*coverage\.fits\n6 samples at 10 min; usable 0\.5 h of 1\.0 h\n$/);
  });

  it('--quiet prints nothing; progress is off when stderr is not a terminal', async () => {
    const { code, cap } = await runWith(['s.json', '--out', 'o', '--quiet'], { 's.json': JSON.stringify(GOOD) });
    expect([code, cap.out, cap.err]).toEqual([0, '', '']);
  });

  it('a failure while writing exits 1 with one line, leaves earlier files untouched and no temporary files', async () => {
    const d = tmp();
    writeFileSync(join(d, 's.json'), JSON.stringify(GOOD));
    mkdirSync(join(d, 'o'));
    writeFileSync(join(d, 'o', 'summary.json'), 'previous run');
    writeFileSync(join(d, 'o', 'coverage.csv'), 'previous run');
    // a result whose map has the wrong size makes the coverage writer fail mid-way
    const broken = fakeEngine((s) => ({ ...syntheticResult(s), maps: [new Float32Array(3), new Float32Array(3)] }));
    const { io: i, cap } = io(d);
    let msg = '';
    await planCommand(['s.json', '--out', 'o'], i, { runPlan: broken.runPlan }).catch((e: Error) => void (msg = e.message));
    expect(msg).toMatch(/coverage map has 3 pixels, expected 768/);
    expect(readdirSync(join(d, 'o')).sort()).toEqual(['coverage.csv', 'summary.json']);
    expect(readFileSync(join(d, 'o', 'summary.json'), 'utf8')).toBe('previous run');
    expect(readFileSync(join(d, 'o', 'coverage.csv'), 'utf8')).toBe('previous run');
    expect(cap.out).toBe('');
  });

  it('an engine failure is exit 1 with one line and no stack trace', async () => {
    const d = tmp();
    writeFileSync(join(d, 's.json'), JSON.stringify(GOOD));
    const { io: i, cap } = io(d);
    const { COMMANDS } = await import('../../src/cli/commands');
    const orig = COMMANDS.plan.run;
    COMMANDS.plan.run = (argv, x) => planCommand(argv, x, { runPlan: async () => { throw new Error('disk on fire\n    at somewhere (x.ts:1:1)'); } });
    try {
      const code = await runCli(['plan', 's.json', '--out', 'o'], i);
      expect(code).toBe(1);
      expect(cap.err).toBe('swathe plan: error: disk on fire at somewhere (x.ts:1:1)\n');
    } finally {
      COMMANDS.plan.run = orig;
    }
  });
});

describe('help and dispatch', () => {
  it('prints help for swathe and for plan', async () => {
    const a = io(tmpdir());
    expect(await runCli(['--help'], a.io)).toBe(0);
    expect(a.cap.out).toContain('swathe plan SCENARIO.json --out DIR');
    const b = io(tmpdir());
    expect(await runCli(['plan', '--help'], b.io)).toBe(0);
    expect(b.cap.out).toBe(PLAN_HELP);
    const c = io(tmpdir());
    expect(await runCli(['explode'], c.io)).toBe(2);
    expect(c.cap.err).toBe('swathe: unknown command "explode" (commands: plan, survey, merge, pattern; see swathe --help)\n');
    const none = io(tmpdir());
    expect(await runCli([], none.io)).toBe(2);
    expect([none.cap.out, none.cap.err.startsWith('swathe ')]).toEqual(['', true]);
    const v = io(tmpdir());
    expect(await runCli(['--version'], v.io)).toBe(0);
    expect(v.cap.out).toMatch(/^swathe \d+\.\d+\.\d+\n$/);
  });
});

describe('progress and atomic writes', () => {
  it('reports progress only when enabled and after half a second; redraws one line on a terminal', () => {
    let now = 0;
    const clock = () => now;
    const lines: string[] = [];
    const mk = (tty: boolean, on: boolean) => progressReporter({ out: () => {}, err: (t) => void lines.push(t), errIsTTY: tty, env: {}, cwd: '/' }, on, clock);
    const off = mk(false, false);
    now = 1000; off.report('ephemeris', 0.5); off.done();
    expect(lines).toEqual([]);
    now = 0;
    const p = mk(false, true);
    p.report('ephemeris', 0.1); // too early
    now = 600; p.report('ephemeris', 0.2);
    now = 700; p.report('ephemeris', 0.3); // same stage, within 2 s
    now = 800; p.report('exposure', 0.0);
    p.done();
    expect(lines).toEqual(['progress: ephemeris 20%\n', 'progress: exposure 0%\n']);
    lines.length = 0;
    // a one-stage run (the survey) states the time left from its rate: 25% in 2 s -> 6 s left
    now = 0;
    const sv = progressReporter({ out: () => {}, err: (x) => void lines.push(x), errIsTTY: false, env: {}, cwd: '/' }, true, clock, { timeLeft: true });
    now = 600; sv.report('survey', 0.02); // under 5% and a second: no projection yet
    now = 2000; sv.report('survey x', 0.25);
    sv.done();
    expect(lines).toEqual(['progress: survey 2%\n', 'progress: survey x 25%, about 6 s left\n']);
    lines.length = 0;
    now = 0;
    const t = mk(true, true);
    now = 600; t.report('hits', 0.456);
    t.done();
    expect(lines[0]).toMatch(/^\rhits\s+ 45%$/);
    expect(lines[1]).toBe('\n');
  });

  it('AtomicFileSet renames only on commit and removes temporaries on abort', () => {
    const d = tmp();
    const a = new AtomicFileSet();
    a.write(join(d, 'x.txt'), ['hello ', new TextEncoder().encode('world')]);
    expect(readdirSync(d)).toHaveLength(1);
    expect(existsSync(join(d, 'x.txt'))).toBe(false);
    expect(a.commit()).toEqual([join(d, 'x.txt')]);
    expect(readFileSync(join(d, 'x.txt'), 'utf8')).toBe('hello world');
    const b = new AtomicFileSet();
    b.write(join(d, 'y.txt'), ['partial']);
    expect(() => b.write(join(d, 'z.txt'), (function* () { yield 'a'; throw new Error('interrupted'); })())).toThrow('interrupted');
    b.abort();
    expect(readdirSync(d)).toEqual(['x.txt']);
  });
});

describe('with the real engine', () => {
  it('runs a fixture scenario end to end through runCli', async () => {
    const d = tmp();
    const fixture = new URL('../fixtures/scenarios/valid-moon.json', import.meta.url).pathname;
    const { io: i, cap } = io(d);
    const code = await runCli(['plan', fixture, '--out', 'o'], i);
    expect([code, cap.err]).toEqual([0, '']);
    const summary = JSON.parse(readFileSync(join(d, 'o', 'summary.json'), 'utf8'));
    expect(summary.samples).toBe(31 * 48); // January 2031 at 30 minutes
    expect(summary.frequencies.map((f: { mhz: number }) => f.mhz)).toEqual([5, 7.5, 20]);
    expect(readFileSync(join(d, 'o', 'track.csv'), 'utf8').trimEnd().split('\n')).toHaveLength(1 + 31 * 48);
    expect(readFileSync(join(d, 'o', 'coverage.csv'), 'utf8').split('\n')[0]).toBe('pixel,ra_deg,dec_deg,l_deg,b_deg,exposure_h_5mhz,exposure_h_7.5mhz,exposure_h_20mhz');
    expect(readdirSync(join(d, 'o')).sort()).toEqual(['antenna_temp.csv', 'coverage.csv', 'coverage.fits', 'depth_area.csv', 'summary.json', 'track.csv']);
  });

  it('as a process: exit codes and one-line stderr (bin/swathe.mjs through tsx)', () => {
    const d = tmp();
    writeFileSync(join(d, 'bad.json'), JSON.stringify({ ...GOOD, telescope: { aperture_m: 'big', frequencies_mhz: [10] } }));
    writeFileSync(join(d, 'good.json'), JSON.stringify(GOOD));
    const bin = new URL('../../bin/swathe.mjs', import.meta.url).pathname;
    const run = (...args: string[]) => spawnSync(process.execPath, [bin, ...args], { cwd: d, encoding: 'utf8', env: { ...process.env, CI: '' } });
    const bad = run('plan', 'bad.json', '--out', 'o');
    expect(bad.status).toBe(2);
    expect(bad.stderr).toBe('swathe plan: bad.json: telescope.aperture_m must be a number between 1 and 100000, got "big"\n');
    const good = run('plan', 'good.json', '--out', 'o');
    expect([good.status, good.stderr]).toEqual([0, '']);
    expect(readdirSync(join(d, 'o')).sort()).toEqual(['antenna_temp.csv', 'coverage.csv', 'coverage.fits', 'depth_area.csv', 'summary.json', 'track.csv']);
  });

  it('Ctrl-C during a run exits 130, keeps the earlier files and leaves no temporary file', async () => {
    const d = tmp();
    // a two-year lunar run at a 1-minute step (about a million samples) takes a few seconds
    writeFileSync(join(d, 'long.json'), JSON.stringify({ ...GOOD, span: { start: '2031-01-01T00:00:00Z', end: '2033-01-01T00:00:00Z', step_min: 1 }, map: { nside: 64 } }));
    mkdirSync(join(d, 'o'));
    writeFileSync(join(d, 'o', 'summary.json'), 'previous run');
    const bin = new URL('../../bin/swathe.mjs', import.meta.url).pathname;
    const child = spawn(process.execPath, [bin, 'plan', 'long.json', '--out', 'o', '--progress'], { cwd: d, stdio: ['ignore', 'pipe', 'pipe'] });
    let err = '';
    const done = new Promise<number | null>((res) => child.on('exit', (code) => res(code)));
    await new Promise<void>((res) => child.stderr.on('data', (b) => { err += String(b); if (err.includes('estimate:')) res(); }));
    await new Promise((r) => setTimeout(r, 300));
    child.kill('SIGINT');
    const code = await done;
    expect(code).toBe(130);
    expect(err).toContain('swathe plan: interrupted (SIGINT); no output file was changed');
    expect(readdirSync(join(d, 'o'))).toEqual(['summary.json']);
    expect(readFileSync(join(d, 'o', 'summary.json'), 'utf8')).toBe('previous run');
  });
});

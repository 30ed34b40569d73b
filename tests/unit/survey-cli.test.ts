import { afterEach, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../../src/cli/run';
import type { CliIo } from '../../src/cli/io';
import { surveyColumns } from '../../src/core/surveyCsv';

// `swathe survey` and `swathe merge` (issue 5 item 1): one CSV row per site,
// shards that merge byte for byte into the unsharded file, exit codes as
// `swathe plan` (0; 2 with one line naming the bad field or flag; 1 otherwise).

const dirs: string[] = [];
afterEach(() => { for (const d of dirs.splice(0)) rmSync(d, { recursive: true, force: true }); });
function tmp(): string {
  const d = mkdtempSync(join(tmpdir(), 'swathe-survey-'));
  dirs.push(d);
  return d;
}

const SCENARIO = {
  format: 'swathe.scenario/1',
  name: 'survey cli fixture, invented',
  site: { body: 'moon', lat_deg: 0, lon_deg: 0 },
  span: { start: '2031-03-01T00:00:00Z', end: '2031-03-11T00:00:00Z', step_min: null },
  telescope: { aperture_m: 400, frequencies_mhz: [8, 16] },
  map: { nside: 32 },
};

async function cli(args: string[], cwd: string) {
  const cap = { out: '', err: '' };
  const io: CliIo = { out: (t) => void (cap.out += t), err: (t) => void (cap.err += t), errIsTTY: false, env: {}, cwd };
  const code = await runCli(args, io);
  return { code, ...cap };
}

function setup(): string {
  const d = tmp();
  writeFileSync(join(d, 's.json'), JSON.stringify(SCENARIO));
  return d;
}

describe('swathe survey', () => {
  it('writes one row per site in grid order with the stated header; shards merge byte for byte into the unsharded file', async () => {
    const d = setup();
    const whole = await cli(['survey', 's.json', '--step-deg', '15', '--out', 'all'], d);
    expect(whole.code, whole.err).toBe(0);
    expect(whole.out).toMatch(/wrote .*survey\.csv/);
    const text = readFileSync(join(d, 'all', 'survey.csv'), 'utf8');
    const lines = ['(metadata in survey.json)', ...text.trimEnd().split('\n')];
    // issue 9 item 10: the CSV starts with its header row; what it holds is in survey.json beside it
    const meta = JSON.parse(readFileSync(join(d, 'all', 'survey.json'), 'utf8'));
    expect(meta).toMatchObject({
      format: 'swathe.survey/3', csv: 'survey.csv', name: 'survey cli fixture, invented', body: 'moon',
      grid: { kind: 'cell-centres', step_deg: 15, nlat: 12, nlon: 24, sites: 288 },
      span: { start: '2031-03-01T00:00:00Z', end: '2031-03-11T00:00:00Z' }, nside: 32, frequencies_mhz: [8, 16], shard: null,
    });
    expect(meta.scenario_fingerprint).toMatch(/^[0-9a-f]{16}$/);
    expect(meta.sky_model).toMatch(/galaxy/i); // the scenario names no sky: the default
    expect(meta.columns.slice(-2)).toEqual(['t_ant_median_k_8mhz', 't_ant_median_k_16mhz']);
    expect(meta.columns).toEqual(surveyColumns([8, 16]));
    expect(text.startsWith('#')).toBe(false);
    expect(lines[1]).toBe(surveyColumns([8, 16]).join(','));
    expect(lines[1].startsWith('site,lat_deg,lon_deg,sky_fraction_covered_8mhz,sky_fraction_covered_16mhz,usable_h,usable_h_beam_in_band_8mhz')).toBe(true);
    expect(lines.length).toBe(2 + 288);
    const cols = lines[1].split(',').length;
    lines.slice(2).forEach((l, k) => {
      const c = l.split(',');
      expect(c.length).toBe(cols);
      expect(Number(c[0])).toBe(k);
    });
    expect(lines[2].split(',').slice(1, 3)).toEqual(['-82.500000', '-172.500000']);
    // far side, southern row: some usable time and some covered sky
    const far = lines[2 + 4 * 24 + 23].split(',');
    expect(Number(far[5])).toBeGreaterThan(0);
    expect(Number(far[3])).toBeGreaterThan(0);

    for (const i of [1, 2, 3]) {
      const r = await cli(['survey', 's.json', '--step-deg', '15', '--out', 'parts', '--shard', `${i}/3`, '--quiet'], d);
      expect(r.code, r.err).toBe(0);
      expect(r.out).toBe('');
    }
    const parts = readdirSync(join(d, 'parts')).sort();
    expect(parts).toEqual(['survey.shard-1-of-3.csv', 'survey.shard-1-of-3.json', 'survey.shard-2-of-3.csv', 'survey.shard-2-of-3.json', 'survey.shard-3-of-3.csv', 'survey.shard-3-of-3.json']);
    expect(readFileSync(join(d, 'parts', 'survey.shard-2-of-3.csv'), 'utf8').split('\n')[0]).toBe(lines[1]);
    expect(JSON.parse(readFileSync(join(d, 'parts', 'survey.shard-2-of-3.json'), 'utf8')).shard).toEqual({ index: 2, count: 3 });
    const m = await cli(['merge', 'parts', '--out', 'merged.csv'], d);
    expect(m.code, m.err).toBe(0);
    expect(m.out).toMatch(/merged\.csv and merged\.json: 288 sites from 3 files/);
    expect(readFileSync(join(d, 'merged.csv'), 'utf8')).toBe(text);
    // the merged JSON is the unsharded one but for the CSV's name
    expect(readFileSync(join(d, 'merged.json'), 'utf8')).toBe(readFileSync(join(d, 'all', 'survey.json'), 'utf8').replace('"csv": "survey.csv"', '"csv": "merged.csv"'));
    // files given one by one, in any order, merge the same
    const m2 = await cli(['merge', ...[3, 1, 2].map((i) => join('parts', `survey.shard-${i}-of-3.csv`)), '--out', 'merged2.csv'], d);
    expect(m2.code, m2.err).toBe(0);
    expect(readFileSync(join(d, 'merged2.csv'), 'utf8')).toBe(text);

    // merge refuses incomplete, doubled, foreign and non-survey input (exit 2, one line)
    const bad = async (args: string[], re: RegExp) => {
      const r = await cli(['merge', ...args, '--out', 'x.csv'], d);
      expect(r.code).toBe(2);
      expect(r.err).toMatch(re);
      expect(r.err.trim().split('\n').length).toBe(1);
      expect(existsSync(join(d, 'x.csv'))).toBe(false);
      expect(existsSync(join(d, 'x.json'))).toBe(false);
    };
    const shardCsv = (i: number) => join('parts', `survey.shard-${i}-of-3.csv`);
    await bad([shardCsv(1), shardCsv(3)], /96 of 288 sites are missing \(the first is site 1\); missing shard 2 of 3/);
    await bad(['parts', join('all', 'survey.csv')], /site 0 appears twice/);
    // survey.json is checked: another scenario's shard is refused, and so is a CSV without its JSON
    writeFileSync(join(d, 'other.csv'), readFileSync(join(d, shardCsv(2)), 'utf8'));
    writeFileSync(join(d, 'other.json'), readFileSync(join(d, 'parts', 'survey.shard-2-of-3.json'), 'utf8').replace(/"scenario_fingerprint": "[0-9a-f]+"/, '"scenario_fingerprint": "0000000000000000"'));
    await bad([shardCsv(1), 'other.csv', shardCsv(3)], /is from a different survey/);
    writeFileSync(join(d, 'lone.csv'), readFileSync(join(d, shardCsv(2)), 'utf8'));
    await bad([shardCsv(1), 'lone.csv', shardCsv(3)], /lone\.csv: its metadata file .*lone\.json is missing/);
    writeFileSync(join(d, 'plain.csv'), 'a,b\n1,2\n');
    await bad(['plain.csv'], /not a survey file/);

    // version 1 (details on a "#" first line, "# shard I/N" second) still merges, into a version-1 file
    const v1Head = '# swathe.survey/1 frequency_mhz=8;16 body=moon grid=cell-centres step_deg=15 nlat=12 nlon=24 sites=288 span=x nside=32 scenario=0123456789abcdef name="v1" (planning estimates from stated models)';
    mkdirSync(join(d, 'v1'));
    for (const i of [1, 2, 3]) writeFileSync(join(d, 'v1', `survey.shard-${i}-of-3.csv`), `${v1Head}\n# shard ${i}/3\n${readFileSync(join(d, shardCsv(i)), 'utf8')}`);
    const m1 = await cli(['merge', 'v1', '--out', 'merged-v1.csv'], d);
    expect(m1.code, m1.err).toBe(0);
    expect(readFileSync(join(d, 'merged-v1.csv'), 'utf8')).toBe(`${v1Head}\n${text}`);
    expect(existsSync(join(d, 'merged-v1.json'))).toBe(false);
    await bad([join('v1', 'survey.shard-1-of-3.csv'), shardCsv(2), shardCsv(3)], /is swathe\.survey\/3 but .* is swathe\.survey\/1/);
    mkdirSync(join(d, 'empty'));
    await bad(['empty'], /no survey\.shard-\*-of-\*\.csv files/);
    await bad(['nothing-here'], /no such file or directory/);
    writeFileSync(join(d, 'cut.csv'), text.slice(0, -5));
    await bad(['cut.csv'], /does not end with a newline/);
  }, 120_000);

  it('refuses bad flags and input with exit 2 and one line naming the flag or field', async () => {
    const d = setup();
    const cases: [string[], RegExp][] = [
      [['s.json', '--step-deg', '0.5', '--out', 'o'], /--step-deg must be a number from 1 to 15 \(degrees\), got "0.5"/],
      [['s.json', '--step-deg', 'abc', '--out', 'o'], /--step-deg must be a number from 1 to 15/],
      [['s.json', '--out', 'o'], /missing --step-deg/],
      [['s.json', '--step-deg', '10'], /missing --out DIR/],
      [['--step-deg', '10', '--out', 'o'], /missing SCENARIO\.json/],
      [['s.json', '--step-deg', '10', '--out', 'o', '--shard', '4/3'], /--shard must be I\/N with 1 <= I <= N \(e\.g\. 3\/8\), got "4\/3"/],
      [['s.json', '--step-deg', '10', '--out', 'o', '--shard', '0/3'], /--shard must be I\/N/],
      [['s.json', '--step-deg', '15', '--out', 'o', '--shard', '1/289'], /--shard N must be at most 288/],
      [['s.json', '--step-deg', '10', '--out', 'o', '--frequency-mhz', '17'], /--frequency-mhz 17 is not one of the scenario's telescope\.frequencies_mhz \(8, 16\)/],
      [['s.json', '--step-deg', '10', '--out', 'o', '--frequency-mhz', '8,,16'], /--frequency-mhz must be a number or a comma-separated list/],
      [['s.json', '--step-deg', '10', '--out', 'o', '--jobs', '0'], /--jobs must be an integer from 1 to 64/],
      [['s.json', '--step-deg', '10', '--out', 'o', '--bogus'], /unknown option --bogus/],
      [['missing.json', '--step-deg', '10', '--out', 'o'], /missing\.json: no such scenario file/],
    ];
    for (const [args, re] of cases) {
      const r = await cli(['survey', ...args], d);
      expect(r.code, args.join(' ')).toBe(2);
      expect(r.err).toMatch(re);
      expect(r.err.trim().split('\n').length).toBe(1);
    }
    writeFileSync(join(d, 'bad.json'), JSON.stringify({ ...SCENARIO, map: { nside: 30 } }));
    const r = await cli(['survey', 'bad.json', '--step-deg', '10', '--out', 'o'], d);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/map\.nside/);
    expect(existsSync(join(d, 'o', 'survey.csv'))).toBe(false);
    const h = await cli(['survey', '--help'], d);
    expect(h.code).toBe(0);
    expect(h.out).toMatch(/--shard I\/N/);
    const hm = await cli(['merge', '--help'], d);
    expect(hm.code).toBe(0);
    const mm = await cli(['merge', 'x'], d);
    expect(mm.code).toBe(2);
    expect(mm.err).toMatch(/missing --out FILE/);
  });

  it('as a process, --jobs 2 (worker threads) writes the same file as one thread', () => {
    const d = setup();
    const bin = join(process.cwd(), 'bin', 'swathe.mjs');
    const one = spawnSync(process.execPath, [bin, 'survey', 's.json', '--step-deg', '15', '--frequency-mhz', '16', '--out', 'a', '--quiet'], { cwd: d, encoding: 'utf8' });
    expect(one.status, one.stderr).toBe(0);
    const two = spawnSync(process.execPath, [bin, 'survey', 's.json', '--step-deg', '15', '--frequency-mhz', '16', '--out', 'b', '--jobs', '2', '--progress'], { cwd: d, encoding: 'utf8' });
    expect(two.status, two.stderr).toBe(0);
    expect(readFileSync(join(d, 'b', 'survey.csv'), 'utf8')).toBe(readFileSync(join(d, 'a', 'survey.csv'), 'utf8'));
    expect(JSON.parse(readFileSync(join(d, 'a', 'survey.json'), 'utf8')).frequencies_mhz).toEqual([16]);
    expect(two.stdout).toMatch(/288 of 288 sites/);
    expect(readdirSync(join(d, 'b')).sort()).toEqual(['survey.csv', 'survey.json']); // no temporary file left
  }, 120_000);
});

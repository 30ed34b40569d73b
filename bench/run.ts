// `npm run bench` prints the benchmark figures, each measured side by side in
// this one run; `npm run bench -- --json` also prints, as its last line, one
// JSON object {"scenarios":[{name, fast_s, naive_s, floor_s, ratio,
// fast_over_floor, max_rel_dev}], "antenna": [...], "survey": {...}, "targets": [...]}.

import { benchCoverage } from './coverage';

const json = process.argv.slice(2).includes('--json');

async function ephemerisLines(): Promise<string[]> {
  // Loaded by name so this runner still works while the ephemeris benchmark is absent.
  const spec = './ephemeris.ts';
  try {
    const mod = (await import(/* @vite-ignore */ spec)) as { benchEphemeris?: () => Promise<{ lines: string[] }> };
    if (typeof mod.benchEphemeris !== 'function') return ['ephemeris benchmark: bench/ephemeris.ts has no benchEphemeris()'];
    return (await mod.benchEphemeris()).lines;
  } catch (e) {
    if ((e as { code?: string }).code === 'ERR_MODULE_NOT_FOUND') return ['ephemeris benchmark: bench/ephemeris.ts not present'];
    throw e;
  }
}

async function main(): Promise<void> {
  console.log(`swathe benchmark, node ${process.version}, ${new Date().toISOString()}`);
  for (const l of await ephemerisLines()) console.log(l);
  const cov = await benchCoverage((l) => console.log(l));
  const antenna = await (await import('./antenna')).benchAntenna((l) => console.log(l)); // issue 11 item 8
  const survey = await (await import('./survey')).benchSurvey((l) => console.log(l)); // issue 5 item 1
  const antennaTemp = await (await import('./antennaTemp')).benchAntennaTemp((l) => console.log(l)); // issue 12 item 8
  const targets = await (await import('./targets')).benchTargets((l) => console.log(l)); // issue 12 item 5
  if (json) console.log(JSON.stringify({ scenarios: cov.scenarios, antenna: antenna.rows, survey: survey.result, antenna_temp: antennaTemp, targets }));
}

main().catch((e) => {
  console.error(`benchmark failed: ${e instanceof Error ? e.stack ?? e.message : String(e)}`);
  process.exit(1);
});

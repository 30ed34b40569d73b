import { readFileSync, statSync } from 'node:fs';
import { resolve } from 'node:path';
import type { Scenario } from '../core/types';
import { SCENARIO_LIMITS, parseScenarioBytes } from '../core/scenario';
import { InputError, oneLine } from './errors';

/** Reads and validates a scenario file; every problem becomes one InputError line naming the field(s). */
export function readScenarioFile(path: string, cwd: string): Scenario {
  const shown = oneLine(path, 200);
  const full = resolve(cwd, path);
  let size: number;
  try {
    const st = statSync(full);
    if (st.isDirectory()) throw new InputError(`${shown}: is a directory, not a scenario file`);
    size = st.size;
  } catch (e) {
    if (e instanceof InputError) throw e;
    const code = (e as NodeJS.ErrnoException).code;
    if (code === 'ENOENT' || code === 'ENOTDIR') throw new InputError(`${shown}: no such scenario file`);
    if (code === 'EACCES' || code === 'EPERM') throw new InputError(`${shown}: not allowed to read the scenario file`);
    throw e;
  }
  if (size > SCENARIO_LIMITS.text_max_bytes) {
    throw new InputError(`${shown}: a scenario file must be at most ${SCENARIO_LIMITS.text_max_bytes} bytes, got ${size}`);
  }
  let bytes: Uint8Array;
  try {
    bytes = readFileSync(full);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code === 'EACCES' || code === 'EPERM') throw new InputError(`${shown}: not allowed to read the scenario file`);
    throw e;
  }
  const r = parseScenarioBytes(bytes, shown);
  if (!r.ok) throw new InputError(`${shown}: ${r.issues.map((i) => i.message.replace(`${shown}: `, '')).join('; ')}`);
  return r.scenario;
}

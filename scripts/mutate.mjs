#!/usr/bin/env node
// Runs StrykerJS for `npm run mutate`, `mutate:focus` and `mutate:probe` (the
// config file, if any, is the argument). Stryker 10 needs Node 22 or later; on
// an older Node it runs under Node 22 fetched by npm (`npm exec --package=node@22`).
import { spawnSync } from 'node:child_process';

const args = ['node_modules/@stryker-mutator/core/bin/stryker.js', 'run', ...process.argv.slice(2)];
const major = Number(process.versions.node.split('.')[0]);
let r;
if (major >= 22) r = spawnSync(process.execPath, args, { stdio: 'inherit' });
else {
  console.error(`Node ${process.versions.node}: Stryker needs Node 22 or later; running it under node@22 from npm`);
  r = spawnSync('npm', ['exec', '--yes', '--package=node@22', '--', 'node', ...args], { stdio: 'inherit' });
}
process.exit(r.status ?? 1);

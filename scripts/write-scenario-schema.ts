// Writes public/swathe.scenario.schema.json from src/core/scenarioSchema.ts.
// Run after changing the scenario format: npx tsx scripts/write-scenario-schema.ts
// (tests/unit/scenario-schema.test.ts fails while the file is out of date).
import { writeFileSync } from 'node:fs';
import { scenarioJsonSchema } from '../src/core/scenarioSchema';

const out = new URL('../public/swathe.scenario.schema.json', import.meta.url);
writeFileSync(out, JSON.stringify(scenarioJsonSchema(), null, 2) + '\n');
console.log(`wrote ${out.pathname}`);

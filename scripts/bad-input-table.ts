// Prints the README table "What bad input gets" (issue 6 item 6) from the same
// cases the test checks (tests/fixtures/scenarios/badInputCases.ts).
// Run: npx tsx scripts/bad-input-table.ts
import { badInputOutcomes, badInputTable } from '../tests/fixtures/scenarios/badInputCases';

process.stdout.write(badInputTable(await badInputOutcomes()));

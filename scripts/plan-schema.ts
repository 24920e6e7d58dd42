/**
 * Writes docs/plan-file.schema.json from the zod plan schema: `npx tsx scripts/plan-schema.ts`.
 * A unit test checks the committed file equals this output, so it cannot go stale.
 */
import { writeFileSync } from 'node:fs';
import { planFileJsonSchemaText } from '../src/lib/schemas/plan-json-schema';

const planSchemaPath = 'docs/plan-file.schema.json';

writeFileSync(planSchemaPath, planFileJsonSchemaText());
process.stdout.write(`wrote ${planSchemaPath}\n`);

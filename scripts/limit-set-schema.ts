// Writes the JSON Schema of the limit-set file from its zod schema (src/lib/schemas/limitSet.ts).
// Run after changing the limit form's fields; a unit test fails while the committed file differs.
import { writeFileSync } from 'node:fs';
import { limitSetJsonSchema } from '../src/lib/schemas/limitSet';

export const schemaFile = 'static/formats/limit-set-v1.schema.json';
export const schemaText = () => JSON.stringify(limitSetJsonSchema(), null, '\t') + '\n';

if (process.argv[1]?.endsWith('limit-set-schema.ts')) {
	writeFileSync(schemaFile, schemaText());
	console.log(`wrote ${schemaFile}`);
}

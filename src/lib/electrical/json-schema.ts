import { z } from 'zod';
import { jobDocumentSchema } from './schema';

/** The job document's JSON Schema (input form: fields with defaults are optional), as formatted text. */
export function jobSchemaText(): string {
	const schema = z.toJSONSchema(jobDocumentSchema, { io: 'input', target: 'draft-2020-12' });
	const doc = { title: 'Ampledger job document', ...schema };
	return `${JSON.stringify(doc, null, '\t')}\n`;
}

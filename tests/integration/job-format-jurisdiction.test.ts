import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { DEMO_JURISDICTION } from '../../seeds/data/demo-accounts';
import { testDb } from '../helpers/db';
import { signedInAs, type HttpClient } from '../helpers/http';
import { call, jobTableCounts, removeJobs, type ErrorBody } from '../helpers/jobs';

const db = testDb();
const created: string[] = [];
let owner: HttpClient;
const cottage = () => JSON.parse(fs.readFileSync(path.resolve('examples/quillmere-cottage.json'), 'utf8'));

beforeAll(async () => {
	owner = await signedInAs('owner');
});

afterAll(async () => {
	await removeJobs(db, created);
	await db.destroy();
});

describe('the jurisdiction in the job document', () => {
	test('an import names the jurisdiction by name (case aside), and the export writes it back', async () => {
		const doc = { ...cottage(), jurisdiction: { name: `  ${DEMO_JURISDICTION.name.toUpperCase()} ` } };
		const res = await call(owner, 'POST', '/api/jobs/import', doc);
		expect(res.status).toBe(201);
		created.push(res.body.job.id);
		const j = await db('jurisdictions').where({ name: DEMO_JURISDICTION.name }).first('id');
		expect(res.body.job).toMatchObject({ jurisdictionId: j.id, jurisdictionName: DEMO_JURISDICTION.name });
		const exported = await call(owner, 'GET', `/api/jobs/${res.body.job.id}/export`);
		expect(exported.body.jurisdiction).toEqual({ name: DEMO_JURISDICTION.name });
	});

	test('a document without a jurisdiction imports with none, and exports null', async () => {
		const res = await call(owner, 'POST', '/api/jobs/import', cottage());
		expect(res.status).toBe(201);
		created.push(res.body.job.id);
		expect(res.body.job.jurisdictionId).toBeNull();
		expect((await call(owner, 'GET', `/api/jobs/${res.body.job.id}/export`)).body.jurisdiction).toBeNull();
	});

	test.each([
		[
			'an unknown name',
			{ name: 'Marrowby Flats Permit Desk' },
			/no jurisdiction named “Marrowby Flats Permit Desk”/,
		],
		['an empty name', { name: ' ' }, /must not be empty/],
		['a name over 200 characters', { name: 'n'.repeat(201) }, /at most 200/],
		['a bare string', 'Quillmere', /must be an object/],
		['an extra field', { name: DEMO_JURISDICTION.name, id: 'x' }, /id/],
	])('refuses %s on jurisdiction.name and imports nothing', async (_what, jurisdiction, message) => {
		const before = await jobTableCounts(db);
		const res = await call<ErrorBody>(owner, 'POST', '/api/jobs/import', { ...cottage(), jurisdiction });
		expect(res.status).toBe(400);
		expect(JSON.stringify(res.body.error.fields)).toMatch(message);
		expect(Object.keys(res.body.error.fields ?? {}).some((k) => k.startsWith('jurisdiction'))).toBe(true);
		expect(await jobTableCounts(db)).toEqual(before);
	});
});

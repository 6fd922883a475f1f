import { afterAll, describe, expect, test } from 'vitest';
import { DEMO_JURISDICTION } from '../../seeds/data/demo-accounts';
import { testDb } from '../helpers/db';
import { signedInAs } from '../helpers/http';
import { call, newJob, removeJobs } from '../helpers/jobs';

const db = testDb();
const created: string[] = [];
afterAll(async () => {
	await removeJobs(db, created);
	await db.destroy();
});

async function jobInJurisdiction(status: string) {
	const owner = await signedInAs('owner');
	const input = newJob();
	const res = await call<{ job: { id: string } }>(owner, 'POST', '/api/jobs', input);
	expect(res.status).toBe(201);
	created.push(res.body.job.id);
	const jurisdiction = await db('jurisdictions').where({ name: DEMO_JURISDICTION.name }).first('id');
	// Only a job with a submitted revision is in the queue; the revision row itself is not read by the page.
	const submitted = status !== 'draft';
	await db('jobs')
		.where({ id: res.body.job.id })
		.update({
			jurisdiction_id: jurisdiction.id,
			status,
			current_revision: submitted ? 1 : 0,
			submitted_at: submitted ? new Date() : null,
		});
	return input;
}

describe('the inspector’s start page', () => {
	test('lists the jobs submitted to the inspector’s jurisdiction and leaves drafts out', async () => {
		const submitted = await jobInJurisdiction('submitted');
		const draft = await jobInJurisdiction('draft');
		const page = await (await signedInAs('inspector')).fetch('/inspector');
		expect(page.status).toBe(200);
		const html = await page.text();
		expect(html).toContain('Plan review queue');
		expect(html).toContain(submitted.address);
		expect(html).not.toContain(draft.address);
	});
});

import type { BrowserContext } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { newContext, shot, signInThroughForm, waitForIslands } from '../helpers/browser';
import { testDb } from '../helpers/db';
import { signedInAs } from '../helpers/http';
import { call, newJob, removeJobs } from '../helpers/jobs';

const db = testDb();
let context: BrowserContext;
let jobId = '';

beforeAll(async () => {
	const owner = await signedInAs('owner');
	const res = await call<{ job: { id: string } }>(
		owner,
		'POST',
		'/api/jobs',
		newJob({ name: 'Job to be deleted' }),
	);
	jobId = res.body.job.id;
	context = await newContext();
});
afterAll(async () => {
	await context?.close();
	await removeJobs(db, [jobId]);
	await db.destroy();
});

describe('deleting a job', () => {
	test('asks first, then removes the job from the firm and keeps its change history', async () => {
		const page = await context.newPage();
		await signInThroughForm(page, 'owner');
		await page.waitForURL((url) => url.pathname === '/contractor');
		await page.goto(`/contractor/jobs/${jobId}`);
		await waitForIslands(page);
		await page.getByRole('button', { name: 'Delete the job…' }).click();
		const dialog = page.getByRole('dialog');
		await dialog.waitFor();
		expect(await dialog.textContent()).toContain('The change history is kept');
		await shot(page, 'job-delete-confirm');

		await dialog.getByRole('button', { name: 'Cancel' }).click();
		expect(await db('jobs').where({ id: jobId }).whereNull('deleted_at').first()).toBeTruthy();

		await page.getByRole('button', { name: 'Delete the job…' }).click();
		await page.getByRole('dialog').getByRole('button', { name: 'Delete the job' }).click();
		await page.waitForURL((url) => url.pathname === '/contractor/jobs');
		expect(await page.getByRole('status').first().textContent()).toContain('The job was deleted');

		const row = await db('jobs').where({ id: jobId }).first('deleted_at');
		expect(row.deleted_at).not.toBeNull();
		const trail = await db('audit_log').where({ job_id: jobId }).pluck('action');
		expect(trail).toEqual(expect.arrayContaining(['create', 'delete']));

		const gone = await page.goto(`/contractor/jobs/${jobId}`);
		expect(gone?.status()).toBe(404);
		await page.close();
	});
});

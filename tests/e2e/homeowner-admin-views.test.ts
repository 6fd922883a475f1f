import { afterAll, describe, expect, test } from 'vitest';
import type { BrowserContext } from 'playwright-core';
import { DEMO_WORKFLOW_JOBS } from '../../seeds/04_demo_workflow';
import { newContext, shot, signInThroughForm, waitForIslands } from '../helpers/browser';
import { testDb } from '../helpers/db';

const db = testDb();
const contexts: BrowserContext[] = [];

afterAll(async () => {
	for (const c of contexts) await c.close();
	await db.destroy();
});

async function context() {
	const c = await newContext();
	contexts.push(c);
	return c;
}

describe('the seeded workflow in the browser', () => {
	test('the homeowner sees the closed permit, its number and the inspection results of their home', async () => {
		const job = await db('jobs')
			.where({ name: DEMO_WORKFLOW_JOBS.closed.name })
			.first('property_id', 'permit_number');
		const page = await (await context()).newPage();
		await signInThroughForm(page, 'homeowner3');
		await page.waitForURL((url) => url.pathname === '/homeowner');
		await page.goto(`/homeowner/homes/${job.property_id}`);
		await waitForIslands(page);
		const permit = page.getByTestId('home-permit').first();
		expect((await permit.getByTestId('permit-status').textContent())?.trim()).toBe('Closed');
		expect((await permit.getByTestId('permit-number').textContent())?.trim()).toBe(job.permit_number);
		await permit.getByTestId('inspections-section').waitFor();
		const text = (await permit.textContent()) ?? '';
		expect(text).toContain('Final inspection');
		expect(text).toMatch(/Passed/);
		expect(text).toContain('Hallway switch box');
		await shot(page, 'homeowner-home-permits');
	});

	test('the administrator finds every job by status and opens one read-only', async () => {
		const page = await (await context()).newPage();
		await signInThroughForm(page, 'admin');
		await page.waitForURL((url) => url.pathname === '/admin');
		await page.getByTestId('admin-jobs-link').click();
		await page.waitForURL((url) => url.pathname === '/admin/jobs');
		await page.getByLabel('Status').selectOption('in-review');
		await page.getByRole('button', { name: 'Show' }).click();
		await page.waitForURL((url) => url.searchParams.get('status') === 'in-review');
		await page.getByRole('link', { name: DEMO_WORKFLOW_JOBS.inReview.name }).waitFor();
		expect(await page.getByRole('link', { name: DEMO_WORKFLOW_JOBS.closed.name }).count()).toBe(0);
		await shot(page, 'admin-jobs-in-review');
		await page.getByRole('link', { name: DEMO_WORKFLOW_JOBS.inReview.name }).click();
		await page
			.getByTestId('admin-job-comments')
			.getByText('Give the grounding electrode conductor size')
			.waitFor();
		await shot(page, 'admin-job-in-review');

		await page.goto('/admin/jobs?status=closed');
		await page.getByRole('link', { name: DEMO_WORKFLOW_JOBS.closed.name }).click();
		await waitForIslands(page);
		await page.getByTestId('timeline').waitFor();
		await page.getByTestId('inspections-section').waitFor();
		expect(await page.getByRole('link', { name: /Revision 1 packet/ }).count()).toBe(1);
		expect(await page.getByRole('button').filter({ hasNotText: 'Sign out' }).count()).toBe(0);
		await shot(page, 'admin-job-closed');
	});
});

import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { DEMO_JURISDICTION } from '../../seeds/data/demo-accounts';
import { newContext, shot, signInThroughForm, waitForIslands } from '../helpers/browser';
import { testDb } from '../helpers/db';
import { signedInAs, type HttpClient } from '../helpers/http';
import { call, circuitAt, loadOf, mainPanel, newJob, removeJobs, uniq } from '../helpers/jobs';

const db = testDb();
const created: string[] = [];
const tag = uniq();
let api: HttpClient;
let context: BrowserContext;
let page: Page;
let jobId = '';
let olderCodeId = '';

beforeAll(async () => {
	api = await signedInAs('owner');
	// A jurisdiction still on an older edition, to see the new-job form follow it.
	olderCodeId = (
		await db('jurisdictions')
			.insert({ name: `Fallowmere Township Permits ${tag}`, code_edition: '2020' })
			.returning('id')
	)[0].id;
	const demo = await db('jurisdictions').where({ name: DEMO_JURISDICTION.name }).first('id');
	const job = (
		await call(api, 'POST', '/api/jobs', newJob({ name: `Porch and hall ${tag}`, jurisdictionId: demo.id }))
	).body.job;
	jobId = job.id;
	created.push(jobId);
	const panelId = (await call(api, 'POST', `/api/jobs/${jobId}/panels`, mainPanel())).body.panel.id;
	// A 20 A breaker on 14 AWG copper: an error-level finding (NEC 2023 240.4(D)) the contractor must explain.
	await call(api, 'POST', `/api/panels/${panelId}/circuits`, {
		...circuitAt(1, {
			label: 'Porch receptacles',
			conductor: { size: '14', material: 'cu', insulationC: 90 },
		}),
		loads: [loadOf({ description: 'Porch outlets' })],
	});
	context = await newContext();
	page = await context.newPage();
	await signInThroughForm(page, 'owner');
	await page.waitForURL('**/contractor**');
}, 60_000);

afterAll(async () => {
	await context?.close();
	await removeJobs(db, created);
	await db('jurisdictions').where({ id: olderCodeId }).delete();
	await db.destroy();
});

describe('the job forms', () => {
	test('choosing the jurisdiction on a new job sets its adopted edition; there is no status menu or permit number field', async () => {
		await page.goto('/contractor/jobs');
		await waitForIslands(page);
		await page.getByRole('button', { name: 'Start a new job' }).click();
		const form = page.getByRole('form', { name: 'New job' });
		await form.waitFor();
		await page.waitForFunction(
			(name) =>
				[...document.querySelectorAll('#job-jurisdictionId option')].some((o) =>
					o.textContent?.includes(name),
				),
			`Fallowmere Township Permits ${tag}`,
		);
		await expect(form.getByLabel('NEC edition adopted by the AHJ').inputValue()).resolves.toBe('2023');
		await form.getByLabel('Jurisdiction (AHJ)').selectOption(olderCodeId);
		await expect(form.getByLabel('NEC edition adopted by the AHJ').inputValue()).resolves.toBe('2020');
		// The contractor may still choose another edition.
		await form.getByLabel('NEC edition adopted by the AHJ').selectOption('2023');
		await expect(form.getByLabel('NEC edition adopted by the AHJ').inputValue()).resolves.toBe('2023');
		await expect(form.getByLabel('Status').count()).resolves.toBe(0);
		await expect(form.getByLabel('Permit number').count()).resolves.toBe(0);
		await shot(page, 'permit-new-job-jurisdiction');
	});
});

describe('the Permit section', () => {
	test('asks for a note on the violation, submits revision 1, lists it with its packet and shows the move in the history', async () => {
		await page.goto(`/contractor/jobs/${jobId}`);
		await waitForIslands(page);
		const section = page.getByTestId('permit-section');
		await section.getByTestId('readiness').waitFor();
		await expect(section.getByTestId('readiness-jurisdiction').getAttribute('data-ok')).resolves.toBe('true');
		const boxes = section.locator('textarea[id^="explain-"]');
		expect(await boxes.count()).toBeGreaterThan(0);
		await shot(page, 'permit-readiness');

		await section.getByRole('button', { name: 'Submit for review' }).click();
		await section.getByText('Explain why this finding is left as it is, or fix it first.').waitFor();
		expect(await db('job_revisions').where({ job_id: jobId }).count({ n: '*' })).toEqual([{ n: '0' }]);

		for (const box of await boxes.all())
			await box.fill('Existing porch home run; the breaker is changed to 15 A at rough-in.');
		await section.getByLabel('Note to the plan reviewer (optional)').fill('Porch and hall only.');
		await section.getByRole('button', { name: 'Submit for review' }).click();
		await section.getByText(/Submitted as revision 1/).waitFor({ timeout: 60_000 });
		await section.getByTestId('revisions-list').waitFor();
		await expect(
			section.getByRole('link', { name: 'Download the rev 1 packet' }).getAttribute('href'),
		).resolves.toBe(`/api/jobs/${jobId}/revisions/1/packet.pdf?download=1`);
		await expect(section.locator('[data-status]').first().textContent()).resolves.toBe(
			'Submitted for plan review',
		);
		const row = await db('jobs').where({ id: jobId }).first('status', 'current_revision');
		expect(row).toEqual({ status: 'submitted', current_revision: 1 });

		const history = page.getByTestId('timeline');
		await history.getByText('Revision 1 stored', { exact: false }).waitFor();
		await expect(
			history.getByText('Submit for review: now “Submitted for plan review”').count(),
		).resolves.toBe(1);
		await shot(page, 'permit-submitted');
	}, 90_000);

	test('withdraws the submission after a confirmation', async () => {
		const section = page.getByTestId('permit-section');
		await section.getByRole('button', { name: 'Withdraw the submission…' }).click();
		await page.getByRole('dialog').getByRole('button', { name: 'Withdraw' }).click();
		await section.getByText('The submission is withdrawn.', { exact: false }).waitFor();
		expect((await db('jobs').where({ id: jobId }).first('status')).status).toBe('withdrawn');
		// Withdrawn, the job may be submitted again as revision 2.
		await section.getByRole('button', { name: 'Submit for review' }).waitFor();
		await page.getByTestId('timeline').getByText('Withdraw the submission: now “Withdrawn”').waitFor();
		await shot(page, 'permit-withdrawn');
	});
});

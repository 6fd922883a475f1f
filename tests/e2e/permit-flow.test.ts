import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { DEMO_JURISDICTION, DEMO_PROPERTIES } from '../../seeds/data/demo-accounts';
import { newContext, shot, signInThroughForm, waitForIslands } from '../helpers/browser';
import { testDb } from '../helpers/db';
import { signedInAs } from '../helpers/http';

// One permit carried from submission to final inspection by the three people it concerns, each in
// their own browser: the contractor, the jurisdiction's inspector and the homeowner.
const db = testDb();
const example = JSON.parse(fs.readFileSync(path.resolve('examples/quillmere-cottage.json'), 'utf8'));
const jobName = `Permit flow e2e ${Date.now().toString(36)}`;
let jobId: string;
let contractor: BrowserContext;
let inspector: BrowserContext;
let homeowner: BrowserContext;
let c: Page;
let i: Page;
let h: Page;

const inAWeek = (days = 7) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);

async function jobStatus(): Promise<string> {
	const row = await db('jobs').where({ id: jobId }).first('status');
	return row.status;
}

/** Waits until the job's status in the database is the one expected (the screens reload after each move). */
async function statusBecomes(status: string) {
	for (let n = 0; n < 100; n++) {
		if ((await jobStatus()) === status) return;
		await new Promise((r) => setTimeout(r, 100));
	}
	expect(await jobStatus()).toBe(status);
}

async function openJobPage() {
	await c.goto(`/contractor/jobs/${jobId}`);
	await waitForIslands(c);
	await c.getByTestId('permit-section').waitFor();
}

async function openReview() {
	await i.goto(`/inspector/jobs/${jobId}`);
	await waitForIslands(i);
}

beforeAll(async () => {
	const owner = await signedInAs('owner');
	const imported = await owner.json<{ job: { id: string } }>('/api/jobs/import', {
		method: 'POST',
		body: {
			...example,
			name: jobName,
			address: DEMO_PROPERTIES.penhallow,
			jurisdiction: { name: DEMO_JURISDICTION.name },
		},
	});
	expect(imported.status).toBe(201);
	jobId = imported.body.job.id;
	[contractor, inspector, homeowner] = await Promise.all([newContext(), newContext(), newContext()]);
	[c, i, h] = await Promise.all([contractor.newPage(), inspector.newPage(), homeowner.newPage()]);
	await signInThroughForm(c, 'owner');
	await c.waitForURL(/\/contractor/);
	await signInThroughForm(i, 'inspector');
	await i.waitForURL(/\/inspector/);
	await signInThroughForm(h, 'homeowner');
	await h.waitForURL(/\/homeowner/);
});

afterAll(async () => {
	await Promise.all([contractor?.close(), inspector?.close(), homeowner?.close()]);
	if (jobId) await db('jobs').where({ id: jobId }).delete();
	await db.destroy();
});

describe('a permit from submission to final inspection, in three browsers', () => {
	test('the contractor runs the readiness check and submits revision 1', async () => {
		await openJobPage();
		await c.getByTestId('readiness').waitFor();
		await c.getByRole('button', { name: 'Submit for review' }).click();
		await statusBecomes('submitted');
		await c.getByTestId('revisions-list').getByText('rev 1', { exact: true }).waitFor();
		await shot(c, 'flow-1-contractor-submitted');
	});

	test('the inspector finds it in the queue, takes it, and pins a comment to a point on a sheet', async () => {
		await i.goto('/inspector');
		await waitForIslands(i);
		const row = i.locator('tr, li').filter({ hasText: jobName }).first();
		await row.waitFor();
		// Taking the job opens its review screen.
		await row.getByTestId('assign').click();
		await i.waitForURL(`**/inspector/jobs/${jobId}`);
		await waitForIslands(i);
		await statusBecomes('in-review');
		// The packet is drawn on canvas by pdfjs-dist, so it shows in headless chromium too.
		await i.locator('[data-testid="packet-viewer"][data-rendered="true"]').waitFor({ timeout: 30_000 });
		const inked = await i.getByTestId('packet-canvas').evaluate((el) => {
			const canvas = el as HTMLCanvasElement;
			const data = canvas.getContext('2d')!.getImageData(0, 0, canvas.width, canvas.height).data;
			let dark = 0;
			for (let k = 0; k < data.length; k += 4) if (data[k]! < 128) dark++;
			return dark;
		});
		expect(inked).toBeGreaterThan(1000);
		await i.getByTestId('pin-mode').click();
		const overlay = i.getByTestId('sheet-overlay');
		const box = (await overlay.boundingBox())!;
		await overlay.click({ position: { x: box.width * 0.5, y: box.height * 0.3 } });
		await i
			.getByLabel('Comment', { exact: true })
			.fill('Show the grounding electrode conductor size on this sheet (NEC 250.66).');
		await i.getByRole('button', { name: 'Add comment' }).click();
		await i.getByTestId('pin').first().waitFor();
		await shot(i, 'flow-2-inspector-pinned-comment');
		const comment = await db('review_comments').where({ job_id: jobId }).first();
		expect(comment.target_kind).toBe('sheet');
		expect(comment.point_x).toBeCloseTo(0.5, 1);
		expect(comment.point_y).toBeCloseTo(0.3, 1);
	});

	test('the inspector requests corrections, listing the open comment', async () => {
		await i.getByRole('button', { name: 'Request corrections' }).click();
		await statusBecomes('corrections');
	});

	test('the contractor answers the comment, changes a circuit and resubmits revision 2', async () => {
		await openJobPage();
		const thread = c.getByTestId('comment').first();
		await thread.waitFor();
		await thread
			.getByRole('textbox')
			.fill('Added: 4 AWG copper GEC to the rod, noted on the load calculation sheet.');
		await thread.getByRole('button', { name: 'Mark addressed' }).click();
		await expect
			.poll(async () => (await db('review_comments').where({ job_id: jobId }).first()).status)
			.toBe('addressed');
		// A change the reviewer will see in the comparison: one circuit's label.
		const owner = await signedInAs('owner');
		const tree = await owner.json<{ circuits: { id: string; label: string; version: number }[] }>(
			`/api/jobs/${jobId}/tree`,
		);
		const circuit = tree.body.circuits[0]!;
		const patched = await owner.json(`/api/circuits/${circuit.id}`, {
			method: 'PATCH',
			body: { version: circuit.version, label: `${circuit.label} (GEC noted)` },
		});
		expect(patched.status).toBe(200);
		await openJobPage();
		await c.getByRole('button', { name: 'Resubmit for review' }).click();
		await statusBecomes('resubmitted');
		await c.getByTestId('revisions-list').getByText('rev 2', { exact: true }).waitFor();
		await shot(c, 'flow-3-contractor-resubmitted');
	});

	test('the inspector sees what changed since revision 1, resolves the comment and approves with a permit number', async () => {
		await i.goto('/inspector');
		await waitForIslands(i);
		const row = i.locator('tr, li').filter({ hasText: jobName }).first();
		// Taking the job opens its review screen.
		await row.getByTestId('assign').click();
		await i.waitForURL(`**/inspector/jobs/${jobId}`);
		await waitForIslands(i);
		await statusBecomes('in-review');
		await i.getByRole('tab', { name: 'Changes since rev 1' }).click();
		await i.getByText('(GEC noted)').first().waitFor();
		await shot(i, 'flow-4-inspector-changes');
		await i.getByRole('tab', { name: /^Comments/ }).click();
		const thread = i.getByTestId('comment').first();
		await thread.getByRole('button', { name: 'Resolve' }).click();
		await expect
			.poll(async () => (await db('review_comments').where({ job_id: jobId }).first()).status)
			.toBe('resolved');
		const approve = i.getByRole('button', { name: 'Approve and issue permit' });
		await expect.poll(() => approve.isEnabled(), { timeout: 15_000 }).toBe(true);
		// The review screen reloads itself after the decision.
		const reloaded = i.waitForEvent('load');
		await approve.click();
		await reloaded;
		await statusBecomes('approved');
		const job = await db('jobs').where({ id: jobId }).first('permit_number');
		expect(job.permit_number).toMatch(/\d/);
		await openReview();
		await expect(i.getByTestId('permit-number').first().textContent()).resolves.toContain(job.permit_number);
	});

	test('rough-in and final are requested by the contractor, scheduled and passed by the inspector', async () => {
		for (const [kind, passed] of [
			['rough-in', 'rough-in-passed'],
			['final', 'final-passed'],
		] as const) {
			await openJobPage();
			const request = c.getByRole('form', { name: 'Request an inspection' });
			await request.getByLabel('Inspection').selectOption(kind);
			await request.getByLabel('Preferred date 1').fill(inAWeek());
			await request.getByRole('button', { name: 'Request the inspection' }).click();
			await expect
				.poll(async () => (await db('inspections').where({ job_id: jobId, kind }).first())?.status)
				.toBe('requested');

			await openReview();
			const schedule = i.getByRole('form', { name: 'Schedule the inspection' });
			await schedule.getByLabel('Date of the visit').fill(inAWeek(3));
			await schedule.getByRole('button', { name: 'Schedule' }).click();
			await expect
				.poll(async () => (await db('inspections').where({ job_id: jobId, kind }).first())?.status)
				.toBe('scheduled');
			await openReview();
			const record = i.getByRole('form', { name: 'Record the result' });
			await record.getByLabel('Passed').check();
			await record.getByLabel('Notes').fill(`${kind} inspection: work as on the approved plans.`);
			await record.getByRole('button', { name: 'Record the result' }).click();
			await statusBecomes(passed);
			// The screen's own status follows the result without a reload.
			await expect
				.poll(() => i.getByTestId('review-status').innerText())
				.toContain(kind === 'final' ? 'Final inspection passed' : 'Rough-in passed');
		}
		await openReview();
		await shot(i, 'flow-5-inspector-final-passed');
	});

	test('the homeowner sees the permit status and both inspection results for their home', async () => {
		const property = await db('jobs').where({ id: jobId }).first('property_id');
		await h.goto(`/homeowner/homes/${property.property_id}`);
		await waitForIslands(h);
		await h.getByText('final inspection: work as on the approved plans.').waitFor();
		const page = await h.locator('main').innerText();
		expect(page).toContain('Final inspection passed');
		expect(page).toContain('rough-in inspection: work as on the approved plans.');
		expect(page).toContain('final inspection: work as on the approved plans.');
		await shot(h, 'flow-6-homeowner-result');
	});
});

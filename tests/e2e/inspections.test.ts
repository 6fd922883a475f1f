import path from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_JURISDICTION, DEMO_PROPERTIES } from '../../seeds/data/demo-accounts';
import { newContext, SCREENSHOT_DIR, shot, signInThroughForm, waitForIslands } from '../helpers/browser';
import { testDb } from '../helpers/db';
import { signedInAs, type HttpClient } from '../helpers/http';
import { call, loadOf, removeJobs } from '../helpers/jobs';
import { storeRevision, submittedJob } from '../helpers/workflow';

const db = testDb();
const jobIds: string[] = [];
let owner: HttpClient;
let contractor: { context: BrowserContext; page: Page };
let inspector: { context: BrowserContext; page: Page };
let homeowner: { context: BrowserContext; page: Page };
let approvedJob: string;
let resubmittedJob: string;
let finalPassedJob: string;
let photo: Buffer;

/** Waits for what the islands show after a request (the shared machine can be slow). */
const poll = <T>(read: () => Promise<T> | T) => expect.poll(read, { timeout: 15_000, interval: 100 });

const inDays = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);

async function person(who: 'owner' | 'inspector' | 'homeowner', start: string) {
	const context = await newContext();
	const page = await context.newPage();
	await signInThroughForm(page, who);
	await page.waitForURL(`**${start}**`);
	return { context, page };
}

beforeAll(async () => {
	owner = await signedInAs('owner');
	const jurisdiction = await db('jurisdictions').where({ name: DEMO_JURISDICTION.name }).first('id');
	approvedJob = (
		await submittedJob(db, owner, jurisdiction.id, { status: 'approved', address: DEMO_PROPERTIES.penhallow })
	).id;
	jobIds.push(approvedJob);
	finalPassedJob = (await submittedJob(db, owner, jurisdiction.id, { status: 'final-passed' })).id;
	jobIds.push(finalPassedJob);

	// A job sent back for corrections and resubmitted with one circuit changed in answer to a comment.
	const job = await submittedJob(db, owner, jurisdiction.id, { status: 'corrections' });
	resubmittedJob = job.id;
	jobIds.push(job.id);
	const reviewer = await db('users').where({ email: DEMO_ACCOUNTS.inspector.email }).first('id');
	await db('review_comments').insert({
		job_id: job.id,
		revision_number: 1,
		author_id: reviewer.id,
		target_kind: 'circuit',
		circuit_id: job.circuitIds[0],
		panel_id: job.panelId,
		target_label: 'Circuit 1 “Kitchen counter”',
		body: 'The counter circuit needs a 15 A breaker on 14 AWG, or show why 20 A.',
	});
	const tree = (await call(owner, 'GET', `/api/jobs/${job.id}/tree`)).body;
	const circuit = tree.circuits.find((c: { id: string }) => c.id === job.circuitIds[0]);
	const patched = await call(owner, 'PATCH', `/api/circuits/${circuit.id}`, {
		ratingA: 15,
		conductor: { size: '14', material: 'cu', insulationC: 90 },
		version: circuit.version,
	});
	expect(patched.status).toBe(200);
	const load = await call(
		owner,
		'POST',
		`/api/circuits/${job.circuitIds[1]}/loads`,
		loadOf({ description: 'Bedside outlets' }),
	);
	expect(load.status).toBe(201);
	await storeRevision(db, job.id, 2);
	await db('jobs').where({ id: job.id }).update({ current_revision: 2, status: 'in-review' });

	photo = await sharp({ create: { width: 800, height: 600, channels: 3, background: '#8a6b4f' } })
		.png()
		.toBuffer();
	contractor = await person('owner', '/contractor');
	inspector = await person('inspector', '/inspector');
	homeowner = await person('homeowner', '/homeowner');
});

afterAll(async () => {
	await Promise.all([contractor, inspector, homeowner].map((p) => p?.context.close()));
	await removeJobs(db, jobIds);
	await db.destroy();
});

describe('inspections in the browser', () => {
	test('the contractor requests a rough-in, the inspector fails it with a photo, the contractor answers the item', async () => {
		const c = contractor.page;
		await c.goto(`/contractor/jobs/${approvedJob}`);
		await waitForIslands(c);
		const section = c.locator('#inspections');
		await section.getByLabel('Preferred date 1').fill(inDays(3));
		await section.getByLabel('Preferred date 2').fill(inDays(5));
		await section.getByLabel(/Note for the inspector/).fill('Side gate is open from 8 a.m.');
		await section.getByRole('button', { name: 'Request the inspection' }).click();
		await poll(() => section.locator('[data-testid="inspection"]').getAttribute('data-status')).toBe(
			'requested',
		);
		await shot(c, 'inspections-contractor-requested');

		const i = inspector.page;
		await i.goto(`/inspector/jobs/${approvedJob}`);
		await waitForIslands(i);
		const card = i.locator('[data-testid="inspection"]');
		await card.getByLabel('Date of the visit').fill(inDays(4));
		await card.getByRole('button', { name: 'Schedule' }).click();
		await poll(() => i.locator('[data-testid="inspection"]').getAttribute('data-status')).toBe('scheduled');
		const scheduled = i.locator('[data-testid="inspection"]');
		await scheduled.getByLabel('Failed: corrections needed').check();
		await scheduled.getByLabel('Notes').fill('Two items before cover.');
		await scheduled
			.getByLabel('Correction items (one a line)')
			.fill('Secure NM cable within 12 in. of the kitchen boxes\nAdd the bonding jumper at the water heater');
		await scheduled
			.getByLabel('Photos (PNG or JPEG, optional)')
			.setInputFiles({ name: 'kitchen-boxes.png', mimeType: 'image/png', buffer: photo });
		await scheduled.getByRole('button', { name: 'Record the result' }).click();
		await poll(() => i.locator('[data-testid="inspection"]').getAttribute('data-status')).toBe('failed');
		await poll(() => i.locator('[data-testid="inspection"] img').count()).toBe(1);
		await poll(() =>
			i.locator('[data-testid="inspection"] img').evaluate((img: HTMLImageElement) => img.naturalWidth),
		).toBe(480);
		await shot(i, 'inspections-inspector-failed');
		expect((await db('jobs').where({ id: approvedJob }).first('status')).status).toBe('rough-in-failed');

		await c.reload();
		await waitForIslands(c);
		await poll(() => section.locator('[data-testid="correction-item"]').count()).toBe(2);
		await poll(() => section.getByTestId('request-blocked').textContent()).toMatch(/2 still open/);
		const items = section.locator('[data-testid="correction-item"]');
		await items
			.nth(0)
			.getByPlaceholder('What was corrected, and how')
			.fill('Stapled within 8 in. of each box.');
		await items.nth(0).getByRole('button', { name: 'Answer' }).click();
		await poll(() => items.nth(0).getAttribute('data-status')).toBe('answered');
		await shot(c, 'inspections-contractor-answering');
		await section.screenshot({ path: path.join(SCREENSHOT_DIR, 'inspections-contractor-section.png') });
	});

	test('the homeowner sees the inspection record and cannot change it', async () => {
		const h = homeowner.page;
		const res = await h.request.get(`/api/jobs/${approvedJob}/inspections`);
		expect(res.status()).toBe(200);
		const body = (await res.json()) as { inspections: { status: string }[]; sides: Record<string, boolean> };
		expect(body.inspections.map((x) => x.status)).toEqual(['failed']);
		expect(body.sides).toEqual({ contractor: false, inspector: false });
	});

	test('the reviewer sees what changed in revision 2, side by side, with the comment it answers', async () => {
		const i = inspector.page;
		await i.goto(`/inspector/jobs/${resubmittedJob}`);
		await waitForIslands(i);
		await i.getByRole('tab', { name: /Changes since rev 1/ }).click();
		const changes = i.getByTestId('revision-changes');
		await changes.waitFor();
		const rows = changes.locator('[data-testid="change-row"]');
		await poll(() => rows.count()).toBe(3);
		expect(await rows.nth(0).getAttribute('title')).toBe('Circuit 1 “Kitchen counter”: rating 20 A → 15 A');
		expect(await rows.nth(1).getAttribute('title')).toBe(
			'Circuit 1 “Kitchen counter”: conductor 12 AWG copper, 90 °C → 14 AWG copper, 90 °C',
		);
		const loadCard = await changes.locator('[data-testid="change"]').nth(1).textContent();
		expect(loadCard).toMatch(/added\s*Load “Bedside outlets”/);
		expect(loadCard).toContain('circuit Circuit 3 “Bedroom lights”');
		const circuitCard = changes.locator('[data-testid="change"]').first();
		expect(await circuitCard.textContent()).toContain('The counter circuit needs a 15 A breaker');
		// The added load raises the panel's connected load: 4 receptacles at 180 VA.
		const figures = await changes.getByTestId('figure-changes').textContent();
		expect(figures).toContain('Panel “Main panel”: connected load');
		expect(figures).toContain('+720 VA');
		await shot(i, 'revision-changes-reviewer');
		await changes.screenshot({ path: path.join(SCREENSHOT_DIR, 'revision-changes-panel.png') });
	});

	test('after the final inspection passed, the inspector closes the permit', async () => {
		const i = inspector.page;
		await i.goto(`/inspector/jobs/${finalPassedJob}`);
		await waitForIslands(i);
		await i.getByRole('button', { name: 'Close the permit' }).click();
		await poll(async () => (await db('jobs').where({ id: finalPassedJob }).first('status')).status).toBe(
			'closed',
		);
		await poll(() => i.getByTestId('inspections-section').textContent()).toContain('Permit status: Closed');
	});

	test('the contractor cancels a request after confirming, and may request again', async () => {
		const jurisdiction = await db('jurisdictions').where({ name: DEMO_JURISDICTION.name }).first('id');
		const jobId = (await submittedJob(db, owner, jurisdiction.id, { status: 'approved' })).id;
		jobIds.push(jobId);
		const made = await call(owner, 'POST', `/api/jobs/${jobId}/inspections`, {
			kind: 'rough-in',
			preferredDates: [inDays(6)],
		});
		expect(made.status).toBe(201);
		const c = contractor.page;
		await c.goto(`/contractor/jobs/${jobId}`);
		await waitForIslands(c);
		const section = c.locator('#inspections');
		await section.getByRole('button', { name: 'Cancel the request' }).click();
		const dialog = c.getByRole('dialog');
		await poll(() => dialog.textContent()).toContain('Cancel the rough-in inspection request?');
		await dialog.getByRole('button', { name: 'Cancel the request' }).click();
		await poll(() => section.locator('[data-testid="inspection"]').getAttribute('data-status')).toBe(
			'cancelled',
		);
		expect((await db('inspections').where({ id: made.body.inspection.id }).first('status')).status).toBe(
			'cancelled',
		);
		await poll(() => section.getByRole('button', { name: 'Request the inspection' }).count()).toBe(1);
	});
});

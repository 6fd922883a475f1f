import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { DEMO_JURISDICTION } from '../../seeds/data/demo-accounts';
import { newContext, shot, signInThroughForm, waitForIslands } from '../helpers/browser';
import { testDb } from '../helpers/db';
import { signedInAs } from '../helpers/http';
import { removeJobs } from '../helpers/jobs';
import { submittedJob } from '../helpers/workflow';

const db = testDb();
let inspector: BrowserContext;
let contractor: BrowserContext;
let page: Page;
let job: Awaited<ReturnType<typeof submittedJob>>;
let sheets = 0;

beforeAll(async () => {
	const jurisdiction = await db('jurisdictions').where({ name: DEMO_JURISDICTION.name }).first('id');
	job = await submittedJob(db, await signedInAs('owner'), jurisdiction.id, {
		status: 'submitted',
		realPacket: true,
		note: 'Existing service stays; two new branch circuits.',
	});
	sheets = (await db('job_revisions').where({ job_id: job.id }).first('packet_pages')).packet_pages;
	inspector = await newContext();
	page = await inspector.newPage();
	page.on('pageerror', (e) => console.error('[review page]', e.message));
	page.on('console', (m) => m.type() === 'error' && console.error('[review console]', m.text()));
	await signInThroughForm(page, 'inspector');
	await page.waitForURL('**/inspector**');
});

afterAll(async () => {
	await inspector?.close();
	await contractor?.close();
	await removeJobs(db, [job.id]);
	await db.destroy();
});

/** Share of the canvas's pixels that are not near-white: 0 for a blank page. */
async function inkOnCanvas(p: Page, selector: string): Promise<number> {
	return p.evaluate((sel) => {
		const c = document.querySelector(sel) as HTMLCanvasElement;
		const data = c.getContext('2d')!.getImageData(0, 0, c.width, c.height).data;
		let ink = 0;
		for (let i = 0; i < data.length; i += 4)
			if (data[i]! < 200 || data[i + 1]! < 200 || data[i + 2]! < 200) ink++;
		return ink / (data.length / 4);
	}, selector);
}

describe('the plan review screen in chromium', () => {
	test('the queue lists the submission with its days waiting and a link, and “Assign to me” opens the review', async () => {
		await page.goto('/inspector');
		await waitForIslands(page);
		const row = page.locator(`tr[data-job="${job.id}"]`);
		await row.waitFor();
		expect((await row.getByTestId('days-waiting').textContent())?.trim()).toBe('0');
		await shot(page, 'review-queue');
		await row.getByRole('button', { name: 'Assign to me' }).click();
		await page.waitForURL(`**/inspector/jobs/${job.id}`);
		expect((await db('jobs').where({ id: job.id }).first('status')).status).toBe('in-review');
	});

	test('renders every sheet of the stored packet on canvas, with thumbnails, and the pages are not blank', async () => {
		await waitForIslands(page);
		await page.waitForFunction(
			() => document.querySelector('[data-testid="packet-viewer"]')?.getAttribute('data-rendered') === 'true',
		);
		expect(await page.getByTestId('sheet-indicator').textContent()).toBe(`Sheet 1 of ${sheets}`);
		expect(await page.getByTestId('thumbnail').count()).toBe(sheets);
		expect(await inkOnCanvas(page, '[data-testid="packet-canvas"]')).toBeGreaterThan(0.01);
		// The last thumbnail is drawn too, not just the first sheet.
		await page.waitForTimeout(300);
		expect(await inkOnCanvas(page, `[data-testid="thumbnail"]:last-of-type canvas`)).toBeGreaterThan(0);
		expect(await page.getByTestId('submission-note').textContent()).toContain('two new branch circuits');
		await shot(page, 'review-screen');

		// Beside the packet: the revision as submitted, from its stored JSON.
		await page.getByRole('tab', { name: 'Panels & circuits' }).click();
		const panels = page.getByTestId('submitted-panels');
		expect(await panels.textContent()).toContain('Kitchen counter');
		expect(await panels.locator('tr[data-circuit]').count()).toBe(2);
		await shot(page, 'review-screen-panels');
		await page.getByRole('tab', { name: 'Findings' }).click();
		await page.getByTestId('submitted-findings').waitFor();
		await page.getByRole('tab', { name: 'Load calculation' }).click();
		await page.getByText('Standard method').first().waitFor();
		await shot(page, 'review-screen-load-calculation');
		await page.getByRole('tab', { name: /Comments/ }).click();
	});

	test('moves between sheets and zooms', async () => {
		const fitWidth = await page.getByTestId('packet-canvas').evaluate((c) => c.clientWidth);
		await page.getByRole('button', { name: 'Next sheet' }).click();
		await page.waitForFunction(
			() => document.querySelector('[data-testid="packet-canvas"]')?.getAttribute('data-sheet') === '2',
		);
		expect(await page.getByTestId('sheet-indicator').textContent()).toBe(`Sheet 2 of ${sheets}`);
		await page.getByRole('button', { name: 'Zoom in' }).click();
		await page.waitForFunction(
			(w) => (document.querySelector('[data-testid="packet-canvas"]') as HTMLElement).clientWidth > w,
			fitWidth,
		);
		await page.getByRole('button', { name: 'Fit width' }).click();
		await page.waitForFunction(
			(w) => (document.querySelector('[data-testid="packet-canvas"]') as HTMLElement).clientWidth === w,
			fitWidth,
		);
		await page.getByTestId('thumbnail').first().click();
		await page.waitForFunction(
			() => document.querySelector('[data-testid="packet-canvas"]')?.getAttribute('data-sheet') === '1',
		);
	});

	test('a click on the page pins a new comment to that point of the sheet, and the pin shows there', async () => {
		await page.getByTestId('pin-mode').click();
		const overlay = page.getByTestId('sheet-overlay');
		const box = (await overlay.boundingBox())!;
		await overlay.click({ position: { x: box.width * 0.3, y: box.height * 0.4 } });
		await page.getByTestId('draft-pin').waitFor();
		await page
			.getByLabel('Comment', { exact: true })
			.fill('Show the grounding electrode conductor size at the service.');
		await page.getByRole('button', { name: 'Add comment' }).click();
		const pin = page.getByTestId('pin');
		await pin.waitFor();
		const row = await db('review_comments')
			.where({ job_id: job.id })
			.first('sheet', 'point_x', 'point_y', 'target_label');
		expect(row.sheet).toBe(1);
		expect(row.point_x).toBeCloseTo(0.3, 2);
		expect(row.point_y).toBeCloseTo(0.4, 2);
		expect(row.target_label).toBe(`Sheet 1 of ${sheets}`);
		// The pin's tip sits where the click was.
		const pinBox = (await pin.boundingBox())!;
		expect(Math.abs(pinBox.x + pinBox.width / 2 - (box.x + box.width * 0.3))).toBeLessThan(3);
		expect(Math.abs(pinBox.y + pinBox.height - (box.y + box.height * 0.4))).toBeLessThan(3);
		expect(await page.getByTestId('comment').count()).toBe(1);
		await shot(page, 'review-screen-pinned-comment');
	});

	test('the contractor answers the comment on the job page and marks it addressed; the reviewer sees it', async () => {
		contractor = await newContext();
		const cp = await contractor.newPage();
		await signInThroughForm(cp, 'owner');
		await cp.waitForURL('**/contractor**');
		await cp.goto(`/contractor/jobs/${job.id}`);
		await waitForIslands(cp);
		const thread = cp.getByTestId('review-comments').getByTestId('comment');
		await thread.waitFor();
		await thread.getByLabel('Your answer').fill('Added 6 AWG copper GEC to the riser on sheet 1.');
		await thread.getByRole('button', { name: 'Mark addressed' }).click();
		await thread.locator('[data-comment-status="addressed"]').waitFor();
		await shot(cp, 'review-comments-contractor');

		await page.reload();
		await waitForIslands(page);
		await page.getByTestId('comment').locator('[data-comment-status="addressed"]').waitFor();
		expect(await page.getByTestId('comment').textContent()).toContain('Added 6 AWG copper GEC');
	});

	test('the reviewer resolves the comment and approves; the screen shows the permit number issued', async () => {
		const comment = page.getByTestId('comment');
		await comment.getByRole('button', { name: 'Resolve' }).click();
		await comment.locator('[data-comment-status="resolved"]').waitFor();
		await page.getByRole('button', { name: 'Approve and issue permit' }).click();
		await page.getByTestId('permit-number').waitFor();
		const stored = await db('jobs').where({ id: job.id }).first('status', 'permit_number');
		expect(stored.status).toBe('approved');
		expect(await page.getByTestId('permit-number').textContent()).toContain(stored.permit_number);
		expect(await page.getByTestId('decision').count()).toBe(0);
		await shot(page, 'review-screen-approved');
	});
});

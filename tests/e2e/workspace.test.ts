import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import sharp from 'sharp';
import { newContext, shot, signInThroughForm, waitForIslands } from '../helpers/browser';
import { testDb } from '../helpers/db';

const stamp = Date.now().toString(36);
const JOB_NAME = `Kitchen remodel ${stamp}`;
const OTHER_EMAIL = `other-${stamp}@brackenholt-electric.example`;
const db = testDb();
let owner: BrowserContext;
let page: Page;
let jobUrl = '';
let panelUrl = '';

/** Tabs from the top of the page until a breaker position has the focus; returns its position number. */
async function tabToPosition(p: Page, position: number): Promise<void> {
	await p.locator('h1').first().click();
	for (let i = 0; i < 80; i++) {
		await p.keyboard.press('Tab');
		const at = await p.evaluate(() => document.activeElement?.getAttribute('data-position'));
		if (at === String(position)) return;
	}
	throw new Error(`Tab never reached position ${position}`);
}

async function openPosition(p: Page, position: number) {
	await p.locator(`[data-position="${position}"]`).click();
	await p.getByTestId('circuit-editor').waitFor();
}

async function setLoadVa(p: Page, row: number, va: string) {
	await p.getByLabel(`Load ${row} rating in volt-amperes`).fill(va);
}

beforeAll(async () => {
	owner = await newContext();
	page = await owner.newPage();
	await signInThroughForm(page, 'owner');
	await page.waitForURL('**/contractor**');
});

afterAll(async () => {
	await owner?.close();
	if (jobUrl) {
		const jobId = jobUrl.split('/').pop()!;
		const sketches = await db('sketches')
			.where({ job_id: jobId })
			.select('id')
			.catch(() => []);
		void sketches;
		await db('jobs')
			.where({ id: jobId })
			.del()
			.catch(() => undefined);
	}
	const other = await db('users').where({ email: OTHER_EMAIL }).first('id');
	if (other) {
		const firms = await db('firm_members').where({ user_id: other.id }).pluck('firm_id');
		await db('users').where({ id: other.id }).del();
		await db('firms').whereIn('id', firms).del();
	}
	await db.destroy();
});

describe('job workspace in the browser', () => {
	test('the contractor start page links to the jobs list', async () => {
		await page.goto('/contractor');
		await waitForIslands(page);
		await page.getByRole('link', { name: 'All jobs' }).click();
		await page.waitForURL('**/contractor/jobs');
		await expect(page.getByRole('heading', { name: 'Jobs', exact: true }).first().isVisible()).resolves.toBe(
			true,
		);
	});

	test('a new job needs a name, keeps what was typed, and opens its page once created', async () => {
		await waitForIslands(page);
		await page.getByRole('button', { name: 'Start a new job' }).click();
		await page.getByLabel('Property address').fill('23 Tamsin Court, Quillmere');
		await page.getByRole('button', { name: 'Create the job' }).click();
		await expect(page.getByText('Give the job a name.').isVisible()).resolves.toBe(true);
		await expect(page.getByLabel('Property address').inputValue()).resolves.toBe(
			'23 Tamsin Court, Quillmere',
		);
		await page.getByLabel('Job name').fill(JOB_NAME);
		await page.getByLabel('Homeowner', { exact: true }).fill('Bram Okonjo-Teale');
		await shot(page, 'workspace-new-job-form');
		await page.getByRole('button', { name: 'Create the job' }).click();
		await page.waitForURL(/\/contractor\/jobs\/[0-9a-f-]{36}/);
		jobUrl = new URL(page.url()).pathname;
		await waitForIslands(page);
		await page.getByTestId('job-name').waitFor();
		await expect(page.getByTestId('job-name').textContent()).resolves.toBe(JOB_NAME);
	});

	test('the job details open for editing with the saved values, and Cancel changes nothing', async () => {
		await page.getByRole('button', { name: 'Edit the job details' }).click();
		const form = page.getByRole('form', { name: 'Job details' });
		await form.waitFor();
		await expect(form.getByLabel('Job name').inputValue()).resolves.toBe(JOB_NAME);
		await expect(form.getByLabel('Homeowner', { exact: true }).inputValue()).resolves.toBe(
			'Bram Okonjo-Teale',
		);
		await expect(form.getByLabel('Existing service rating (A)').inputValue()).resolves.toBe('200');
		await shot(page, 'workspace-job-details-form');
		await form.getByRole('button', { name: 'Cancel' }).click();
		await page.getByTestId('job-details').waitFor();
		await expect(page.getByTestId('job-name').textContent()).resolves.toBe(JOB_NAME);
	});

	test('rooms and a panelboard are added without a page reload', async () => {
		await page.getByLabel('Room name').fill('Main kitchen');
		await page.getByLabel('Room type').selectOption('kitchen');
		await page.getByLabel('Area (ft²)').fill('180');
		await page.getByRole('button', { name: 'Add the room' }).click();
		await page.getByTestId('rooms-table').getByText('Main kitchen', { exact: true }).waitFor();

		await page.getByLabel('Spaces').fill('20');
		await page.getByRole('button', { name: 'Add the panelboard' }).click();
		await page.getByTestId('panels-list').getByRole('heading', { name: 'Main panel' }).waitFor();
		await page.getByTestId('load-calculation').waitFor();
		await shot(page, 'workspace-job-page');
		await page.getByRole('link', { name: 'Open the panel editor' }).click();
		await page.waitForURL(/\/panels\//);
		panelUrl = new URL(page.url()).pathname;
		await waitForIslands(page);
		await page.getByTestId('panel-grid').waitFor();
	});

	test('keyboard alone: Tab reaches a position and Enter opens its form', async () => {
		await tabToPosition(page, 1);
		await page.keyboard.press('Enter');
		await page.getByTestId('circuit-editor').waitFor();
		await expect(page.getByRole('heading', { name: 'New breaker at position 1' }).isVisible()).resolves.toBe(
			true,
		);
		const focused = await page.evaluate(() => document.activeElement?.id);
		expect(focused).toBe('circuit-editor-title');
	});

	test('three circuits with loads are added, and the leg totals follow the typing', async () => {
		await page.getByLabel('Label (circuit directory, 408.4(A))').fill('Kitchen counter receptacles');
		await page.getByLabel('Breaker rating').selectOption('20');
		await page.getByRole('button', { name: 'Add a load' }).click();
		const legBefore = await page.getByTestId('leg-A').textContent();
		await setLoadVa(page, 1, '1500');
		await page.waitForFunction(
			(before) => document.querySelector('[data-testid="leg-A"]')?.textContent !== before,
			legBefore,
		);
		await expect(page.getByTestId('leg-A').textContent()).resolves.toContain('12.5 A');
		await page.getByRole('button', { name: 'Add the breaker' }).click();
		await page.getByText('Saved Kitchen counter receptacles.').waitFor();

		await openPosition(page, 3);
		await page.getByLabel('Label (circuit directory, 408.4(A))').fill('Bedroom lighting');
		await page.getByLabel('Breaker rating').selectOption('15');
		await page.getByLabel('Conductor size (AWG)').selectOption('14');
		await page.getByRole('button', { name: 'Add a load' }).click();
		await page.getByLabel('Load 1 kind').selectOption('lighting');
		await setLoadVa(page, 1, '600');
		await page.getByRole('button', { name: 'Add the breaker' }).click();
		await page.getByText('Saved Bedroom lighting.').waitFor();

		await openPosition(page, 2);
		await page.getByLabel('Label (circuit directory, 408.4(A))').fill('Dryer');
		await page.getByLabel('Poles').selectOption('2');
		await page.getByLabel('Breaker rating').selectOption('30');
		await page.getByLabel('Conductor size (AWG)').selectOption('10');
		await page.getByRole('button', { name: 'Add a load' }).click();
		await page.getByLabel('Load 1 kind').selectOption('dryer');
		await page.getByLabel('Load 1 voltage').selectOption('240');
		await setLoadVa(page, 1, '5000');
		await page.getByRole('button', { name: 'Add the breaker' }).click();
		await page.getByText('Saved Dryer.').waitFor();
		await expect(page.locator('[data-position="2"]').getAttribute('aria-label')).resolves.toContain(
			'Positions 2 & 4',
		);
	});

	test('raising a continuous load past the breaker shows a violation before saving', async () => {
		await openPosition(page, 1);
		await page.getByLabel('Load 1 continuous (3 hours or more)').check();
		await setLoadVa(page, 1, '1800');
		// 1800 VA ÷ 120 V = 15 A; × 125 % = 18.75 A on a 20 A breaker (210.20(A)): no violation yet.
		await expect(page.getByTestId('breaker-load').textContent()).resolves.toContain('18.8 A of 20 A');
		expect(await page.getByTestId('circuit-figures').locator('[data-severity="violation"]').count()).toBe(0);
		await setLoadVa(page, 1, '2000');
		// 2000 VA ÷ 120 V = 16.67 A; × 125 % = 20.83 A > 20 A.
		await page.getByTestId('circuit-findings').locator('[data-severity="violation"]').first().waitFor();
		await expect(page.locator('[data-position="1"] [data-severity="violation"]').count()).resolves.toBe(1);
		await shot(page, 'workspace-panel-overloaded');
		await page.getByRole('button', { name: 'Save the circuit' }).click();
		await page.getByText('Saved Kitchen counter receptacles.').waitFor();
	});

	test('a breaker moves to a free position', async () => {
		await openPosition(page, 3);
		await page.getByLabel('Move to…').selectOption('5');
		await page.getByRole('button', { name: 'Move the breaker' }).click();
		await page.getByText('Moved Bedroom lighting to position 5.').waitFor();
		await expect(page.locator('[data-position="5"]').getAttribute('aria-label')).resolves.toContain(
			'Bedroom lighting',
		);
		await expect(page.locator('[data-position="3"]').getAttribute('aria-label')).resolves.toBe(
			'Position 3: space',
		);
		await shot(page, 'workspace-panel-editor');
	});

	test('a sketch uploads with its caption and shows a thumbnail; a wrong file is refused with a message', async () => {
		await page.goto(jobUrl);
		await waitForIslands(page);
		const png = await sharp({ create: { width: 320, height: 200, channels: 3, background: '#c5d1de' } })
			.png()
			.toBuffer();
		await page
			.getByLabel('Files (PNG, JPEG or PDF)')
			.setInputFiles({ name: 'first-floor.png', mimeType: 'image/png', buffer: png });
		await page.getByLabel('Caption').fill('First floor plan');
		await page.getByRole('button', { name: 'Upload' }).click();
		await page.getByText('1 sketch added.').waitFor();
		await page.getByTestId('sketches').getByRole('img', { name: 'First floor plan' }).waitFor();

		await page
			.getByLabel('Files (PNG, JPEG or PDF)')
			.setInputFiles({ name: 'notes.png', mimeType: 'image/png', buffer: Buffer.from('not a picture') });
		await page.getByRole('button', { name: 'Upload' }).click();
		await page
			.getByText(/could not be read|not a PNG|PNG, JPEG or PDF/)
			.first()
			.waitFor();
	});

	test('after a reload everything is still there, and findings link to their circuit', async () => {
		await page.reload();
		await waitForIslands(page);
		await page.getByTestId('rooms-table').getByText('Main kitchen', { exact: true }).waitFor();
		await page.getByTestId('sketches').getByRole('img', { name: 'First floor plan' }).waitFor();
		const link = page
			.getByTestId('findings')
			.locator('li[data-finding]')
			.filter({ has: page.locator('[data-severity="violation"]') })
			.getByRole('link')
			.first();
		await expect(link.getAttribute('href')).resolves.toMatch(/\/panels\/[0-9a-f-]{36}\?circuit=/);
		await expect(
			page.getByTestId('load-calculation').locator('[data-method="standard"]').isVisible(),
		).resolves.toBe(true);
		await expect(
			page.getByTestId('load-calculation').locator('[data-method="optional"]').isVisible(),
		).resolves.toBe(true);
		await shot(page, 'workspace-job-page-after-reload');

		await link.click();
		await waitForIslands(page);
		await page.getByTestId('circuit-editor').waitFor();
		await expect(page.locator('[data-position="1"]').getAttribute('aria-pressed')).resolves.toBe('true');
		await expect(page.locator('[data-position="5"]').getAttribute('aria-label')).resolves.toContain(
			'Bedroom lighting',
		);
		await expect(page.locator('[data-position="2"]').getAttribute('aria-label')).resolves.toContain('Dryer');
	});

	test('the panel editor fits a phone screen', async () => {
		const phone = await newContext({ mobile: true });
		try {
			const p = await phone.newPage();
			await signInThroughForm(p, 'owner');
			await p.waitForURL('**/contractor**');
			await p.goto(panelUrl);
			await waitForIslands(p);
			await openPosition(p, 1);
			await shot(p, 'workspace-panel-editor-phone');
			const overflow = await p.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
			expect(overflow).toBeLessThanOrEqual(0);
		} finally {
			await phone.close();
		}
	});

	test('a contractor of another firm sees none of it', async () => {
		const other = await newContext();
		try {
			const p = await other.newPage();
			await p.goto('/sign-up');
			await waitForIslands(p);
			await p.getByLabel('Firm name').fill(`Brackenholt Wiring ${stamp}`);
			await p.getByLabel('Electrical contractor licence number').fill('EC-77120');
			await p.getByLabel('Your name').fill('Ysolde Brackenholt');
			await p.getByLabel('E-mail').fill(OTHER_EMAIL);
			await p.getByLabel('Password', { exact: true }).fill('another-firm-2026');
			await p.getByLabel('Password again').fill('another-firm-2026');
			await p.getByRole('button', { name: 'Register the firm' }).click();
			await p.waitForURL('**/contractor?welcome=1');
			await p.goto('/contractor/jobs');
			await waitForIslands(p);
			await p
				.getByText(/No jobs yet|job(s)? · page/)
				.first()
				.waitFor();
			expect(await p.getByText(JOB_NAME).count()).toBe(0);
			const res = await p.goto(jobUrl);
			expect(res?.status()).toBe(404);
			await expect(p.getByRole('heading', { name: 'Nothing here' }).isVisible()).resolves.toBe(true);
			const panel = await p.goto(panelUrl);
			expect(panel?.status()).toBe(404);
		} finally {
			await other.close();
		}
	});
});

import fs from 'node:fs';
import path from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { newContext, shot, signInThroughForm, waitForIslands } from '../helpers/browser';
import { testDb } from '../helpers/db';
import { signedInAs, type HttpClient } from '../helpers/http';
import { call, circuitAt, loadOf, mainPanel, newJob, removeJobs } from '../helpers/jobs';

const stamp = Date.now().toString(36);
const db = testDb();
const created: string[] = [];
let api: HttpClient;
let context: BrowserContext;
let page: Page;
let jobId = '';
let panelId = '';
let bedroomId = '';
let lightingCircuit: { id: string };
let hallCircuit: { id: string; version: number };

beforeAll(async () => {
	api = await signedInAs('owner');
	const job = (await call(api, 'POST', '/api/jobs', newJob({ name: `Bedroom wing ${stamp}` }))).body.job;
	jobId = job.id;
	created.push(jobId);
	bedroomId = (
		await call(api, 'POST', `/api/jobs/${jobId}/rooms`, {
			name: 'Back bedroom',
			type: 'bedroom',
			areaFt2: 168,
		})
	).body.room.id;
	panelId = (await call(api, 'POST', `/api/jobs/${jobId}/panels`, mainPanel())).body.panel.id;
	lightingCircuit = (
		await call(
			api,
			'POST',
			`/api/panels/${panelId}/circuits`,
			circuitAt(1, {
				label: 'Bedroom lighting',
				ratingA: 15,
				conductor: { size: '14', material: 'cu', insulationC: 90 },
			}),
		)
	).body.circuit;
	hallCircuit = (
		await call(api, 'POST', `/api/panels/${panelId}/circuits`, {
			...circuitAt(3, { label: 'Hall receptacles' }),
			loads: [loadOf({ description: 'Hall outlets' })],
		})
	).body.circuit;
	context = await newContext();
	page = await context.newPage();
	await signInThroughForm(page, 'owner');
	await page.waitForURL('**/contractor**');
});

afterAll(async () => {
	await context?.close();
	await removeJobs(db, created);
	await db.destroy();
});

const panelUrl = () => `/contractor/jobs/${jobId}/panels/${panelId}`;

async function openPosition(p: Page, position: number) {
	await p.locator(`[data-position="${position}"]`).click();
	await p.getByTestId('circuit-editor').waitFor();
}

describe('lighting layout', () => {
	test('a 14 × 12 ft room gets fixtures clear of 16 in joists, and they land on a circuit as a load', async () => {
		await page.goto(`/contractor/jobs/${jobId}/lighting`);
		await waitForIslands(page);
		await page.getByLabel('Room', { exact: true }).selectOption(bedroomId);
		await page.getByRole('textbox', { name: 'Length' }).fill('14');
		await page.getByRole('textbox', { name: 'Width' }).fill('12');
		await page.getByRole('textbox', { name: 'Ceiling height' }).fill('8');
		await page.getByRole('textbox', { name: 'Fixture size' }).fill('4');
		await page.getByLabel('Joist direction').selectOption('along-width');
		await page.getByRole('textbox', { name: 'Spacing on centre' }).fill('16');
		await page.getByRole('textbox', { name: 'First joist from wall' }).fill('16');
		const svg = page.getByTestId('layout-svg');
		await svg.waitFor();
		const heading = (await page.locator('#drawing-h').textContent()) ?? '';
		const count = Number(/(\d+) fixtures/.exec(heading)?.[1]);
		expect(count).toBeGreaterThan(0);
		const drawn = await svg.evaluate((el) => ({
			fixtures: [...el.querySelectorAll('g > circle:last-of-type')].map((c) => Number(c.getAttribute('cx'))),
			joists: [...el.querySelectorAll('line[stroke-dasharray]')].map((l) => Number(l.getAttribute('x1'))),
		}));
		expect(drawn.fixtures).toHaveLength(count);
		// Joists 16 in on centre from 16 in across a 14 ft (168 in) room: 16, 32, ..., 160 in, ten of them.
		expect(drawn.joists.map((x) => Math.round(x * 12))).toEqual([16, 32, 48, 64, 80, 96, 112, 128, 144, 160]);
		// A 4 in fixture (2 in radius) must sit in a bay, its centre at least 2 in from each joist line.
		for (const x of drawn.fixtures)
			for (const j of drawn.joists) expect(Math.abs(x - j) * 12).toBeGreaterThanOrEqual(2 - 1e-6);
		await shot(page, 'more-lighting-layout');

		await page.getByLabel('Circuit', { exact: true }).selectOption(lightingCircuit.id);
		await page.getByRole('button', { name: `Add ${count} fixtures as loads` }).click();
		await page.getByText(`Added ${count} fixtures`).waitFor();

		await page.goto(`${panelUrl()}?circuit=${lightingCircuit.id}`);
		await waitForIslands(page);
		await page.getByTestId('circuit-editor').waitFor();
		await expect(page.getByLabel('Load 1 kind').inputValue()).resolves.toBe('lighting');
		await expect(page.getByLabel('Load 1 quantity').inputValue()).resolves.toBe(String(count));
		await expect(page.getByLabel('Load 1 description').inputValue()).resolves.toMatch(/recessed lights/);
		await shot(page, 'more-lighting-load-in-panel-editor');
	});
});

describe('panel editor', () => {
	test('leaving a circuit with unsaved changes asks first, by keyboard too; Keep editing keeps them', async () => {
		await page.goto(panelUrl());
		await waitForIslands(page);
		await openPosition(page, 3);
		const label = page.getByLabel('Label (circuit directory, 408.4(A))');
		await label.fill('Hall and landing receptacles');
		await page.locator('[data-position="5"]').click();
		const dialog = page.getByRole('dialog', { name: 'Discard the unsaved changes to circuit 3?' });
		await dialog.waitFor();
		await shot(page, 'more-discard-dialog');
		// Keep editing has the focus; Escape closes the question and keeps the edits.
		await expect(page.evaluate(() => document.activeElement?.textContent)).resolves.toBe('Keep editing');
		await page.keyboard.press('Escape');
		await dialog.waitFor({ state: 'hidden' });
		await expect(label.inputValue()).resolves.toBe('Hall and landing receptacles');
		await expect(
			page.getByRole('heading', { name: /Positions 3: Hall receptacles/ }).isVisible(),
		).resolves.toBe(true);

		await page.locator('[data-position="5"]').click();
		await dialog.waitFor();
		await page.keyboard.press('Tab');
		await expect(page.evaluate(() => document.activeElement?.textContent)).resolves.toBe(
			'Discard the changes',
		);
		await page.keyboard.press('Enter');
		await page.getByRole('heading', { name: 'New breaker at position 5' }).waitFor();
		expect(await page.getByRole('dialog').count()).toBe(0);

		// Nothing was saved, and a form without edits changes position without asking.
		await openPosition(page, 3);
		await expect(label.inputValue()).resolves.toBe('Hall receptacles');
		await openPosition(page, 1);
		expect(
			await page
				.getByRole('dialog')
				.isVisible()
				.catch(() => false),
		).toBe(false);
		await page.getByRole('heading', { name: /Bedroom lighting/ }).waitFor();
	});

	test('a load the circuit cannot supply is refused beside the load, and nothing is saved', async () => {
		await page.goto(panelUrl());
		await waitForIslands(page);
		await openPosition(page, 3);
		await page.getByLabel('Label (circuit directory, 408.4(A))').fill('Hall, renamed in a refused save');
		await page.getByRole('button', { name: 'Add a load' }).click();
		await page.getByLabel('Load 2 kind').selectOption('fixed-appliance');
		await page.getByLabel('Load 2 description').fill('Wall heater');
		await page.getByLabel('Load 2 voltage').selectOption('240');
		await page.getByLabel('Load 2 rating in volt-amperes').fill('1500');
		// Before saving, the live check names the load by its circuit and row, not by the document's path.
		const live = page.getByText('The checks run once the job is complete enough:');
		await live.waitFor();
		await expect(live.textContent()).resolves.toMatch(
			/Circuit 3 \(“Hall, renamed in a refused save”\), load 2, voltage: a 240 V load cannot be supplied/,
		);
		await expect(live.textContent()).resolves.not.toMatch(/loads\[\d+\]/);
		await shot(page, 'more-live-check-in-words');
		await page.getByRole('button', { name: 'Save the circuit' }).click();
		// A 1-pole breaker in a 120/240 V panel supplies 120 V only.
		await page
			.getByTestId('loads-table')
			.getByText(/240 V load cannot be supplied/)
			.waitFor();
		await shot(page, 'more-refused-load');
		const now = await call(api, 'GET', `/api/panels/${panelId}`);
		const hall = now.body.circuits.find((c: { id: string }) => c.id === hallCircuit.id);
		expect(hall.label).toBe('Hall receptacles');
		expect(now.body.loads.filter((l: { circuitId: string }) => l.circuitId === hallCircuit.id)).toHaveLength(
			1,
		);
	});

	test('a circuit changed by someone else after the page loaded shows the current values and reloads', async () => {
		await page.goto(panelUrl());
		await waitForIslands(page);
		await openPosition(page, 3);
		const changed = await call(api, 'PATCH', `/api/circuits/${hallCircuit.id}`, {
			version: hallCircuit.version,
			label: 'Hall receptacles (office)',
			lengthFt: 65,
		});
		expect(changed.status).toBe(200);
		const label = page.getByLabel('Label (circuit directory, 408.4(A))');
		await label.fill('Hall receptacles, mine');
		await page.getByRole('button', { name: 'Save the circuit' }).click();
		await page.getByText('Someone else changed this circuit').waitFor();
		const current = page.getByTestId('conflict-current');
		await expect(current.textContent()).resolves.toContain('Hall receptacles (office)');
		await expect(current.textContent()).resolves.toContain('65');
		await expect(current.textContent()).resolves.toContain('Hall outlets');
		// The breaker type in words (circuitAt makes an AFCI breaker), not its stored value 'afci'.
		await expect(current.textContent()).resolves.toContain('AFCI');
		await shot(page, 'more-conflict');
		await page.getByRole('button', { name: 'Load the current values' }).click();
		await page.waitForFunction(
			() =>
				(document.querySelector('#c-label') as HTMLInputElement | null)?.value ===
				'Hall receptacles (office)',
		);
		expect(await page.getByText('Someone else changed this circuit').count()).toBe(0);
		// Applying the change again now saves (the editor has the new version).
		await label.fill('Hall receptacles, mine');
		await page.getByRole('button', { name: 'Save the circuit' }).click();
		await page.getByText('Saved Hall receptacles, mine.').waitFor();
		const row = await db('circuits').where({ id: hallCircuit.id }).first('label', 'length_ft', 'version');
		expect([row.label, Number(row.length_ft), row.version]).toEqual(['Hall receptacles, mine', 65, 3]);
	});
});

describe('jobs list', () => {
	const word = `Zephyrine${stamp}`;

	test('searches by a word, filters by status, sorts by name and pages', async () => {
		for (let i = 1; i <= 23; i++) {
			const n = String(i).padStart(2, '0');
			const job = (await call(api, 'POST', '/api/jobs', newJob({ name: `${word} job ${n}` }))).body.job;
			created.push(job.id);
			// The workflow owns the status: set one directly to have something to filter.
			if (i % 8 === 0) await db('jobs').where({ id: job.id }).update({ status: 'withdrawn' });
		}
		await page.goto('/contractor/jobs');
		await waitForIslands(page);
		const list = page.getByTestId('jobs-list');
		await page.getByLabel('Search').fill(word.toLowerCase());
		await page.getByText('23 jobs · page 1 of 2').waitFor();
		await page.getByLabel('Sort').selectOption('name');
		await page.waitForFunction(
			(w) => document.querySelector('[data-testid="jobs-list"] a')?.textContent === `${w} job 01`,
			word,
		);
		expect(await list.locator('li').count()).toBe(20);
		await page.getByRole('button', { name: 'Next' }).click();
		await page.getByText('23 jobs · page 2 of 2').waitFor();
		await page.waitForFunction(
			(w) => document.querySelector('[data-testid="jobs-list"] a')?.textContent === `${w} job 21`,
			word,
		);
		await expect(list.locator('a').allTextContents()).resolves.toEqual([
			`${word} job 21`,
			`${word} job 22`,
			`${word} job 23`,
		]);
		await shot(page, 'more-jobs-page-2');

		await page.getByLabel('Status').selectOption('withdrawn');
		await page.getByText('2 jobs · page 1 of 1').waitFor();
		await page.waitForFunction(() => document.querySelectorAll('[data-testid="jobs-list"] li').length === 2);
		await expect(list.locator('a').allTextContents()).resolves.toEqual([`${word} job 08`, `${word} job 16`]);
		await page.getByLabel('Status').selectOption('closed');
		await page.getByText('No job matches. Clear the search or the status filter.').waitFor();
		await page.getByLabel('Status').selectOption('');
		await page.getByLabel('Search').fill(`${word} job 07`);
		await page.getByText('1 job · page 1 of 1').waitFor();
		await shot(page, 'more-jobs-search');
	});

	test('imports a job file, and a bad file shows each problem with its path and imports nothing', async () => {
		const file = path.resolve('examples/quillmere-cottage.json');
		const doc = JSON.parse(fs.readFileSync(file, 'utf8'));
		await page.goto('/contractor/jobs');
		await waitForIslands(page);

		const bad = structuredClone(doc);
		bad.circuits[0].ratingA = 17;
		bad.loads[1].watts = -5;
		bad.name = `Broken import ${stamp}`;
		await page.getByLabel('Job file (.json)').setInputFiles({
			name: 'broken.json',
			mimeType: 'application/json',
			buffer: Buffer.from(JSON.stringify(bad)),
		});
		await page.getByRole('button', { name: 'Import as a new job' }).click();
		const problems = page.getByTestId('import-problems');
		await problems.waitFor();
		await expect(problems.textContent()).resolves.toMatch(/circuits\.0\.ratingA: .*240\.6/);
		await expect(problems.textContent()).resolves.toMatch(/loads\.1\.watts: /);
		await shot(page, 'more-import-bad');
		expect(await db('jobs').where({ name: bad.name }).count<{ count: string }[]>('* as count')).toEqual([
			{ count: '0' },
		]);

		await page.getByLabel('Job file (.json)').setInputFiles({
			name: 'notes.json',
			mimeType: 'application/json',
			buffer: Buffer.from('these are not JSON'),
		});
		await page.getByRole('button', { name: 'Import as a new job' }).click();
		await page.getByText('“notes.json” is not a JSON file.', { exact: false }).waitFor();

		const named = { ...doc, name: `${doc.name} ${stamp}` };
		await page.getByLabel('Job file (.json)').setInputFiles({
			name: 'quillmere-cottage.json',
			mimeType: 'application/json',
			buffer: Buffer.from(JSON.stringify(named)),
		});
		await page.getByRole('button', { name: 'Import as a new job' }).click();
		await page.getByText(`Imported “${named.name}”`).waitFor();
		const href = await page.getByRole('link', { name: 'Open the imported job' }).getAttribute('href');
		const importedId = href!.split('/').pop()!;
		created.push(importedId);
		await expect(
			page.getByText(/Imported .*: \d+ rooms, \d+ panels, \d+ circuits, \d+ loads/).isVisible(),
		).resolves.toBe(true);
		// The list shows it at once.
		await page.getByTestId('jobs-list').getByRole('link', { name: named.name }).waitFor();
		await shot(page, 'more-import-ok');
		const counts = await call(api, 'GET', `/api/jobs/${importedId}/tree`);
		expect(counts.body.rooms).toHaveLength(doc.rooms.length);
		expect(counts.body.circuits).toHaveLength(doc.circuits.length);
		expect(counts.body.loads).toHaveLength(doc.loads.length);
	});
});

describe('rooms', () => {
	test('a room is edited in place and keeps the change after a reload', async () => {
		await page.goto(`/contractor/jobs/${jobId}`);
		await waitForIslands(page);
		const table = page.getByTestId('rooms-table');
		await table.getByRole('button', { name: 'Edit Back bedroom' }).click();
		await table.getByLabel('Room name').fill('Back bedroom (north)');
		await table.getByLabel('Area (ft²)').fill('');
		await table.getByRole('button', { name: 'Save the room' }).click();
		await table.locator('.field-error').first().waitFor();
		await expect(table.locator('.field-error').first().textContent()).resolves.toBe(
			'Enter the floor area in square feet.',
		);
		await shot(page, 'more-room-edit-error');
		await table.getByLabel('Area (ft²)').fill('172');
		await table.getByRole('button', { name: 'Save the room' }).click();
		await table.getByText('Back bedroom (north)', { exact: true }).waitFor();
		await expect(table.getByText('172 ft²').isVisible()).resolves.toBe(true);
		await shot(page, 'more-room-edited');
		await page.reload();
		await waitForIslands(page);
		await page.getByTestId('rooms-table').getByText('Back bedroom (north)', { exact: true }).waitFor();
		const row = await db('rooms').where({ id: bedroomId }).first('name', 'area_ft2', 'version');
		expect([row.name, Number(row.area_ft2), row.version]).toEqual(['Back bedroom (north)', 172, 2]);
	});
});

import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { BrowserContext } from 'playwright-core';
import { DEMO_PROPERTIES } from '../../seeds/data/demo-accounts';
import { newContext, shot, signInThroughForm, waitForIslands } from '../helpers/browser';
import { testDb } from '../helpers/db';
import { signedInAs } from '../helpers/http';

const db = testDb();
const example = JSON.parse(fs.readFileSync(path.resolve('examples/quillmere-cottage.json'), 'utf8'));
let jobId: string;
let mapPath: string;
let phone: BrowserContext | null = null;
let desk: BrowserContext | null = null;

beforeAll(async () => {
	const owner = await signedInAs('owner');
	const imported = await owner.json<{ job: { id: string } }>('/api/jobs/import', {
		method: 'POST',
		body: {
			...example,
			name: `Panel map e2e ${Date.now().toString(36)}`,
			address: DEMO_PROPERTIES.penhallow,
		},
	});
	expect(imported.status).toBe(201);
	jobId = imported.body.job.id;
	const link = await owner.json<{ link: string }>(`/api/jobs/${jobId}/map-token`, { method: 'POST' });
	mapPath = new URL(link.body.link).pathname;
});

afterAll(async () => {
	await phone?.close();
	await desk?.close();
	if (jobId) await db('jobs').where({ id: jobId }).delete();
	await db.destroy();
});

describe('the homeowner’s panel map on a phone', () => {
	test('a search for the dishwasher highlights its breaker and shows its rooms and loads, beside the cautions', async () => {
		phone = await newContext({ mobile: true });
		const page = await phone.newPage();
		await page.goto(mapPath);
		await waitForIslands(page);
		await expect(page.getByTestId('map-cautions').textContent()).resolves.toContain(
			'Switch the breaker off and verify with a tester',
		);
		await page.getByLabel('Find a breaker').fill('dishwasher');
		const hit = page.locator('[data-hit="true"]');
		await expect(hit.count()).resolves.toBe(1);
		await expect(hit.first().getAttribute('data-position')).resolves.toBe('19');
		const details = page.getByTestId('breaker-details');
		await expect(details.textContent()).resolves.toContain('Kitchen');
		// Both columns fit the phone's width: nothing scrolls sideways.
		const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
		expect(overflow).toBeLessThanOrEqual(0);
		await hit.first().scrollIntoViewIfNeeded();
		await shot(page, 'panel-map-phone-dishwasher');

		await page.getByLabel('Find a breaker').fill('breaker 14');
		await expect(page.locator('[data-hit="true"]').first().getAttribute('data-position')).resolves.toBe('14');
		await expect(details.textContent()).resolves.toContain('EV charger');
		await page.getByLabel('Find a breaker').fill('garage');
		await expect(page.locator('[data-hit="true"]').count()).resolves.toBe(3);
		await shot(page, 'panel-map-phone-garage');

		await page.getByRole('link', { name: 'Print view of the card' }).click();
		await page.waitForURL(`**${mapPath}/card`);
		await expect(page.locator('body').textContent()).resolves.toContain('Dishwasher');
		await shot(page, 'panel-map-phone-card');
	});
});

describe('documents on the contractor’s job page', () => {
	test('preparing the packet shows progress, then a preview and a download link', async () => {
		desk = await newContext();
		const page = await desk.newPage();
		await signInThroughForm(page, 'owner');
		await page.waitForURL('**/contractor**');
		await page.goto(`/contractor/jobs/${jobId}`);
		const section = page.getByTestId('job-documents');
		await section.scrollIntoViewIfNeeded();
		await waitForIslands(page);
		await expect(section.getByTestId('map-link').textContent()).resolves.toContain(mapPath);

		// A lighting layout for the packet: a bad entry gets messages beside its fields, a good one is listed.
		await section.getByRole('button', { name: 'Add a layout' }).click();
		const form = section.getByRole('form', { name: 'New lighting layout' });
		await form.getByLabel('Room length, ft').fill('-3');
		await form.getByRole('button', { name: 'Save the layout' }).click();
		await expect(form.getByText('Give the layout a name').count()).resolves.toBe(1);
		await expect(form.getByText('must be more than 0 feet').count()).resolves.toBe(1);
		await shot(page, 'job-documents-layout-errors');
		await form.getByLabel('Name').fill('Kitchen cans');
		await form.getByLabel('Room', { exact: true }).selectOption({ label: 'Kitchen' });
		await form.getByLabel('Room length, ft').fill('16');
		await form.getByLabel('Room width, ft').fill('12');
		await form.getByRole('button', { name: 'Save the layout' }).click();
		await section.getByText('Kitchen cans').waitFor();

		await section.getByRole('button', { name: 'Prepare the packet' }).click();
		await expect(section.getByTestId('packet-progress').textContent()).resolves.toContain(
			'Preparing the packet…',
		);
		await section.getByTestId('packet-ready').waitFor({ timeout: 30_000 });
		await expect(
			section.getByRole('link', { name: 'Download the packet' }).getAttribute('download'),
		).resolves.toMatch(/\.pdf$/);
		await expect(section.locator('iframe[title="Permit packet preview"]').count()).resolves.toBe(1);
		await shot(page, 'job-documents-packet-ready');
	});
});

import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { hashPassword } from '../../src/lib/passwords';
import { newContext, shot, waitForIslands } from '../helpers/browser';
import { testDb } from '../helpers/db';
import { uniq } from '../helpers/jobs';

const db = testDb();
const password = 'keep-the-fee-schedule';
let jurisdictionId: string;
let userIds: string[] = [];
let context: BrowserContext | null = null;

/** A staff member of the test's own jurisdiction, with a password to sign in through the form. */
async function staff(role: 'inspector' | 'administrator'): Promise<string> {
	const email = `${role}-${uniq()}@saltmarsh-reach.example`;
	const [u] = await db('users')
		.insert({
			email,
			name: role === 'administrator' ? 'Peregrine Olde' : 'Tamsin Wexcombe',
			password_hash: await hashPassword(password),
		})
		.returning('id');
	userIds.push(u.id);
	await db('jurisdiction_inspectors').insert({
		jurisdiction_id: jurisdictionId,
		user_id: u.id,
		staff_role: role,
	});
	return email;
}

async function signIn(page: Page, email: string) {
	await page.goto('/sign-in');
	await waitForIslands(page);
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await page.waitForURL((url) => url.pathname === '/inspector');
}

beforeAll(async () => {
	const [j] = await db('jurisdictions')
		.insert({
			name: `Saltmarsh Reach Permit Desk ${uniq()}`,
			code_edition: '2023',
			address: '1 Tidegate Row',
		})
		.returning('id');
	jurisdictionId = j.id;
});

afterAll(async () => {
	await context?.close();
	await db('jurisdictions').where({ id: jurisdictionId }).delete();
	await db('users').whereIn('id', userIds).delete();
	userIds = [];
	await db.destroy();
});

describe('the jurisdiction settings page in the browser', () => {
	test('the administrator types fees in dollars, sees the example fee and the permit number preview, and saves cents', async () => {
		const email = await staff('administrator');
		context = await newContext();
		const page = await context.newPage();
		await signIn(page, email);
		await page.goto(`/inspector/jurisdictions/${jurisdictionId}`);
		await waitForIslands(page);

		await page.getByLabel('Base permit fee').fill('80');
		await page.getByLabel('Per new or modified circuit').fill('12.50');
		await page.getByLabel('Per panel').fill('35');
		await page.getByLabel('Service change', { exact: true }).fill('1,250.00');
		// Example: 8 circuits, 2 panels, a service change: 80.00 + 100.00 + 70.00 + 1,250.00 = 1,500.00.
		await expect.poll(() => page.getByTestId('fee-total').textContent()).toBe('$1,500.00');

		await page.getByLabel('Permit number pattern').fill('SR-{YYYY}-{SEQ:3}');
		const year = new Date().getFullYear();
		await expect.poll(() => page.getByTestId('permit-preview').textContent()).toContain(`SR-${year}-001`);
		await page.getByLabel('GFCI list (210.8(A))').selectOption('2017');
		await page.getByLabel('At least one floor-plan sketch').check();
		await shot(page, 'jurisdiction-settings-filled');

		await page.getByRole('button', { name: 'Save the settings' }).click();
		await page.getByText('The settings are saved.').waitFor();
		const row = await db('jurisdictions').where({ id: jurisdictionId }).first();
		expect(row).toMatchObject({
			fee_base_cents: 8_000,
			fee_per_circuit_cents: 1_250,
			fee_per_panel_cents: 3_500,
			fee_service_change_cents: 125_000,
			permit_number_pattern: 'SR-{YYYY}-{SEQ:3}',
			amendments: { gfciEdition: '2017', afciEdition: null },
			required_documents: { panelSchedules: true, loadCalculation: true, sketch: true },
		});

		await page.reload();
		await waitForIslands(page);
		expect(await page.getByLabel('Service change', { exact: true }).inputValue()).toBe('1250.00');
		await page.close();
	});

	test('an amount that is not dollars and cents is named on its field and nothing is saved', async () => {
		const page = await context!.newPage();
		await page.goto(`/inspector/jurisdictions/${jurisdictionId}`);
		await waitForIslands(page);
		const before = await db('jurisdictions').where({ id: jurisdictionId }).first();
		await page.getByLabel('Base permit fee').fill('eighty');
		await page.getByLabel('Permit number pattern').fill('SR-{YYYY}');
		await page.getByRole('button', { name: 'Save the settings' }).click();
		await page.getByText('Enter dollars and cents, e.g. 125.00 (up to 1,000,000.00).').waitFor();
		await page
			.getByText('The pattern needs {SEQ:n} (n from 1 to 9) for the running number.')
			.first()
			.waitFor();
		await shot(page, 'jurisdiction-settings-errors');
		expect(await db('jurisdictions').where({ id: jurisdictionId }).first()).toEqual(before);
		await page.close();
	});

	test('a plain inspector of the jurisdiction sees the settings without a way to change them', async () => {
		const email = await staff('inspector');
		const other = await newContext();
		try {
			const page = await other.newPage();
			await signIn(page, email);
			await page.goto(`/inspector/jurisdictions/${jurisdictionId}`);
			await waitForIslands(page);
			await page.getByText('Only the jurisdiction’s administrators change them.').waitFor();
			expect(await page.getByRole('button', { name: 'Save the settings' }).count()).toBe(0);
			expect(await page.getByLabel('Base permit fee').isDisabled()).toBe(true);
			// The example is for anyone who reads the schedule: 80.00 + 4 × 12.50 + 2 × 35.00 + 1,250.00.
			await page.getByLabel('New or modified circuits').fill('4');
			await expect.poll(() => page.getByTestId('fee-total').textContent()).toBe('$1,450.00');
			await shot(page, 'jurisdiction-settings-read-only');
		} finally {
			await other.close();
		}
	});
});

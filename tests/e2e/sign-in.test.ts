import type { BrowserContext } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { DEMO_ACCOUNTS } from '../../seeds/data/demo-accounts';
import { newContext, shot, signInThroughForm, waitForIslands } from '../helpers/browser';

let context: BrowserContext;
beforeAll(async () => {
	context = await newContext();
});
afterAll(async () => {
	await context?.close();
});

async function freshPage() {
	await context.clearCookies();
	return context.newPage();
}

describe('signing in through the browser', () => {
	test.each([
		['owner', '/contractor', 'Tallowmere Electric Co.'],
		['inspector', '/inspector', 'Quillmere County Building Division'],
		['homeowner', '/homeowner', '417 Fenwick Reach Road'],
		['admin', '/admin', 'Accounts'],
	] as const)('the demo %s lands on %s and sees their own start page', async (who, path, text) => {
		const page = await freshPage();
		await signInThroughForm(page, who);
		await page.waitForURL((url) => url.pathname === path);
		await expect(page.getByText(text).first().isVisible()).resolves.toBe(true);
		expect((await page.getByTestId('signed-in-as').textContent())?.trim()).toBe(DEMO_ACCOUNTS[who].name);
		await shot(page, `start-${who}`);
		await page.close();
	});

	test('a wrong password shows the message and stays on the sign-in page', async () => {
		const page = await freshPage();
		await signInThroughForm(page, 'electrician', 'definitely-wrong');
		const alert = page.getByRole('alert');
		await alert.waitFor();
		expect(await alert.textContent()).toContain('do not match an account');
		expect(new URL(page.url()).pathname).toBe('/sign-in');
		expect(await page.getByLabel('E-mail').inputValue()).toBe(DEMO_ACCOUNTS.electrician.email);
		await shot(page, 'sign-in-wrong-password');
		await page.close();
	});

	test('an empty form shows a message on each field without calling the server', async () => {
		const page = await freshPage();
		await page.goto('/sign-in');
		await waitForIslands(page);
		await page.getByRole('button', { name: 'Sign in' }).click();
		await page.getByText('Enter your e-mail address.').waitFor();
		expect(await page.getByText('Enter your password.').isVisible()).toBe(true);
		await page.close();
	});

	test('a signed-out visit to a protected page lands on sign-in and returns there after signing in', async () => {
		const page = await freshPage();
		await page.goto('/admin');
		expect(new URL(page.url()).pathname).toBe('/sign-in');
		await shot(page, 'sign-in-redirected');
		await waitForIslands(page);
		await page.getByLabel('E-mail').fill(DEMO_ACCOUNTS.admin.email);
		await page.getByLabel('Password').fill(DEMO_ACCOUNTS.admin.password);
		await page.getByRole('button', { name: 'Sign in' }).click();
		await page.waitForURL((url) => url.pathname === '/admin');
		await page.close();
	});

	test('signing out returns to the sign-in page and the start page is closed again', async () => {
		const page = await freshPage();
		await signInThroughForm(page, 'homeowner');
		await page.waitForURL((url) => url.pathname === '/homeowner');
		await page.getByRole('button', { name: 'Sign out' }).click();
		await page.waitForURL((url) => url.pathname === '/sign-in');
		await page.goto('/homeowner');
		expect(new URL(page.url()).pathname).toBe('/sign-in');
		await page.close();
	});
});

describe('registering a firm through the browser', () => {
	test('a new firm registers on a phone-sized screen and lands on its contractor page', async () => {
		const phone = await newContext({ mobile: true });
		try {
			const page = await phone.newPage();
			await page.goto('/sign-up');
			await waitForIslands(page);
			await page.getByRole('button', { name: 'Register the firm' }).click();
			await page.getByText('Enter the firm’s name (at least 2 characters).').waitFor();
			await shot(page, 'sign-up-empty-phone');
			await page.getByLabel('Firm name').fill('Brackenfold Wiring');
			await page.getByLabel('Electrical contractor licence number').fill('EC-5521');
			await page.getByLabel('Your name').fill('Anselm Brackenfold');
			await page.getByLabel('E-mail').fill(`anselm-${Date.now()}@brackenfold.example`);
			await page.getByLabel('Password', { exact: true }).fill('a-good-long-password');
			await page.getByLabel('Password again').fill('a-good-long-password');
			await page.getByRole('button', { name: 'Register the firm' }).click();
			await page.waitForURL((url) => url.pathname === '/contractor');
			expect(await page.getByText('Brackenfold Wiring').first().isVisible()).toBe(true);
			await shot(page, 'sign-up-done-phone');
		} finally {
			await phone.close();
		}
	});
});

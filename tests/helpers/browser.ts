import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { DEMO_ACCOUNTS } from '../../seeds/data/demo-accounts';
import { BASE_URL } from './http';

const FLAGS = [
	'--headless',
	'--no-sandbox',
	'--disable-gpu',
	'--disable-quic',
	'--no-first-run',
	'--disable-background-networking',
	'--disable-component-update',
	'--disable-sync',
];

export const SCREENSHOT_DIR = process.env.SCREENSHOT_DIR ?? path.resolve('test-results/screenshots');

/** A fresh chromium profile (Debian's /usr/bin/chromium) with its own cookies. */
export async function newContext(options: { mobile?: boolean } = {}): Promise<BrowserContext> {
	const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'ampledger-chromium-'));
	const context = await chromium.launchPersistentContext(dir, {
		executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
		args: FLAGS,
		viewport: options.mobile ? { width: 390, height: 844 } : { width: 1280, height: 860 },
		baseURL: BASE_URL,
	});
	context.on('close', () => {
		fs.promises.rm(dir, { recursive: true, force: true, maxRetries: 5 }).catch(() => undefined);
	});
	return context;
}

/** Saves a full-page screenshot under test-results/screenshots (git-ignored) for a person to look at. */
export async function shot(page: Page, name: string): Promise<string> {
	fs.mkdirSync(SCREENSHOT_DIR, { recursive: true });
	const file = path.join(SCREENSHOT_DIR, `${name}.png`);
	await page.screenshot({ path: file, fullPage: true });
	return file;
}

/** Signs in through the sign-in form as a person would. */
export async function signInThroughForm(page: Page, who: keyof typeof DEMO_ACCOUNTS, password?: string) {
	const a = DEMO_ACCOUNTS[who];
	await page.goto('/sign-in');
	await waitForIslands(page);
	await page.getByLabel('E-mail').fill(a.email);
	await page.getByLabel('Password').fill(password ?? a.password);
	await page.getByRole('button', { name: 'Sign in' }).click();
}

/** Waits until every React island on the page has hydrated (Astro drops the ssr attribute then). */
export async function waitForIslands(page: Page) {
	await page.waitForFunction(() => document.querySelectorAll('astro-island[ssr]').length === 0);
}

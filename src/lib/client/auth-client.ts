/** Browser helpers for sign-in and sign-out against the Auth.js routes, without a page redirect on failure. */

export type SignInResult = { ok: true } | { ok: false; code: string };

async function csrfToken(): Promise<string> {
	const res = await fetch('/api/auth/csrf', { credentials: 'same-origin' });
	const data = (await res.json()) as { csrfToken: string };
	return data.csrfToken;
}

/** Signs in with e-mail and password; on failure returns the reason code instead of navigating. */
export async function signInWithPassword(email: string, password: string): Promise<SignInResult> {
	const res = await fetch('/api/auth/callback/credentials', {
		method: 'POST',
		credentials: 'same-origin',
		headers: { 'Content-Type': 'application/x-www-form-urlencoded', 'X-Auth-Return-Redirect': '1' },
		body: new URLSearchParams({ email, password, csrfToken: await csrfToken(), callbackUrl: '/start' }),
	});
	if (!res.ok) return { ok: false, code: 'server' };
	const data = (await res.json()) as { url?: string };
	const url = new URL(data.url ?? '/', window.location.origin);
	const error = url.searchParams.get('error');
	if (error) return { ok: false, code: url.searchParams.get('code') ?? error };
	return { ok: true };
}

/** Ends the session and goes to the sign-in page. */
export async function signOutNow(): Promise<void> {
	await fetch('/api/auth/signout', {
		method: 'POST',
		credentials: 'same-origin',
		headers: { 'Content-Type': 'application/x-www-form-urlencoded', 'X-Auth-Return-Redirect': '1' },
		body: new URLSearchParams({ csrfToken: await csrfToken(), callbackUrl: '/sign-in' }),
	});
	window.location.href = '/sign-in?signedOut=1';
}

/** Words for each sign-in failure code. Wrong password and unknown account share one message. */
export const SIGN_IN_MESSAGES: Record<string, string> = {
	wrong_credentials: 'That e-mail and password do not match an account. Check both and try again.',
	invalid_input: 'Enter a valid e-mail address and your password.',
	throttled: 'Too many failed attempts. For your account’s safety, wait 15 minutes and try again.',
	server: 'We could not reach the server. Check your connection and try again.',
};

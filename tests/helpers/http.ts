import { DEMO_ACCOUNTS } from '../../seeds/data/demo-accounts';

export const BASE_URL = process.env.AMPLEDGER_BASE_URL ?? 'http://127.0.0.1:4399';

/** A client with its own cookie jar, talking to the real server over HTTP. */
export class HttpClient {
	private cookies = new Map<string, string>();

	private cookieHeader(): string {
		return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
	}

	private keep(res: Response) {
		for (const c of res.headers.getSetCookie()) {
			const [pair] = c.split(';');
			const i = pair!.indexOf('=');
			const name = pair!.slice(0, i).trim();
			const value = pair!.slice(i + 1).trim();
			if (value === '' || /max-age=0/i.test(c) || /expires=Thu, 01 Jan 1970/i.test(c))
				this.cookies.delete(name);
			else this.cookies.set(name, value);
		}
	}

	/** Sends a request with this client's cookies and an Origin header (Astro refuses cross-site POSTs). */
	async fetch(path: string, init: RequestInit = {}): Promise<Response> {
		const headers = new Headers(init.headers);
		if (this.cookies.size) headers.set('cookie', this.cookieHeader());
		headers.set('origin', BASE_URL);
		const res = await fetch(BASE_URL + path, { redirect: 'manual', ...init, headers });
		this.keep(res);
		return res;
	}

	async json<T = unknown>(
		path: string,
		init: Omit<RequestInit, 'body'> & { body?: unknown } = {},
	): Promise<{ status: number; body: T }> {
		const { body, ...rest } = init;
		const res = await this.fetch(path, {
			...rest,
			headers: { 'content-type': 'application/json', ...(rest.headers as Record<string, string>) },
			body: body === undefined ? undefined : typeof body === 'string' ? body : JSON.stringify(body),
		});
		const text = await res.text();
		return { status: res.status, body: (text ? JSON.parse(text) : null) as T };
	}

	/** Signs in through the Auth.js credentials callback; returns the failure code or null on success. */
	async signIn(email: string, password: string): Promise<string | null> {
		const csrf = (await (await this.fetch('/api/auth/csrf')).json()) as { csrfToken: string };
		const res = await this.fetch('/api/auth/callback/credentials', {
			method: 'POST',
			headers: { 'content-type': 'application/x-www-form-urlencoded', 'x-auth-return-redirect': '1' },
			body: new URLSearchParams({ email, password, csrfToken: csrf.csrfToken, callbackUrl: '/start' }),
		});
		const { url } = (await res.json()) as { url: string };
		const u = new URL(url);
		return u.searchParams.get('error') ? (u.searchParams.get('code') ?? u.searchParams.get('error')) : null;
	}
}

/** A client already signed in as one of the demo accounts. */
export async function signedInAs(who: keyof typeof DEMO_ACCOUNTS): Promise<HttpClient> {
	const client = new HttpClient();
	const a = DEMO_ACCOUNTS[who];
	const failure = await client.signIn(a.email, a.password);
	if (failure) throw new Error(`demo sign-in as ${who} failed: ${failure}`);
	return client;
}

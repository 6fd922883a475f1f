/** Browser helpers for the JSON API: one error type for every failed request, and the words for it. */

/** A failed API request, carrying the one JSON error shape the server answers with. */
export class ApiError extends Error {
	readonly status: number;
	readonly code: string;
	readonly fields: Record<string, string[]>;
	readonly current: unknown;

	constructor(
		status: number,
		code: string,
		message: string,
		fields: Record<string, string[]> = {},
		current?: unknown,
	) {
		super(message);
		this.status = status;
		this.code = code;
		this.fields = fields;
		this.current = current;
	}
}

interface ErrorShape {
	error?: { code?: string; message?: string; fields?: Record<string, string[]>; current?: unknown };
}

const OFFLINE =
	'We could not reach the server. Check your connection and try again; nothing you typed is lost.';

async function toApiError(res: Response): Promise<ApiError> {
	const body = (await res.json().catch(() => null)) as ErrorShape | null;
	const e = body?.error;
	const fallback =
		res.status === 404
			? 'This record no longer exists, or it is not yours to see.'
			: `The server answered with an error (${res.status}). Please try again.`;
	return new ApiError(res.status, e?.code ?? 'internal', e?.message ?? fallback, e?.fields ?? {}, e?.current);
}

/** Sends a request; JSON bodies are encoded, FormData passes through. Resolves with the parsed JSON (null for 204). */
export async function api<T = unknown>(
	path: string,
	init: Omit<RequestInit, 'body'> & { body?: unknown } = {},
): Promise<T> {
	const { body, ...rest } = init;
	const headers = new Headers(rest.headers);
	let payload: BodyInit | undefined;
	if (body instanceof FormData) payload = body;
	else if (body !== undefined) {
		headers.set('content-type', 'application/json');
		payload = JSON.stringify(body);
	}
	headers.set('accept', 'application/json');
	let res: Response;
	try {
		res = await fetch(path, { credentials: 'same-origin', ...rest, headers, body: payload });
	} catch {
		throw new ApiError(0, 'offline', OFFLINE);
	}
	if (!res.ok) throw await toApiError(res);
	if (res.status === 204) return null as T;
	const text = await res.text();
	return (text ? JSON.parse(text) : null) as T;
}

/** A message for any thrown value, in our words. */
export function messageOf(err: unknown): string {
	if (err instanceof ApiError) return err.message;
	if (err instanceof Error && err.message) return err.message;
	return 'Something went wrong. Please try again.';
}

/** The first message for each field of a validation error, keyed by dotted path. */
export function firstFieldMessages(err: unknown): Record<string, string> {
	const out: Record<string, string> = {};
	if (!(err instanceof ApiError)) return out;
	for (const [k, msgs] of Object.entries(err.fields)) if (msgs[0]) out[k] = msgs[0];
	return out;
}

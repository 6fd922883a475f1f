import type { z } from 'zod';

export type ErrorCode =
	| 'validation'
	| 'unauthenticated'
	| 'forbidden'
	| 'not_found'
	| 'conflict'
	| 'too_large'
	| 'unsupported_type'
	| 'too_many_requests'
	| 'internal';

const STATUS: Record<ErrorCode, number> = {
	validation: 400,
	unauthenticated: 401,
	forbidden: 403,
	not_found: 404,
	conflict: 409,
	too_large: 413,
	unsupported_type: 415,
	too_many_requests: 429,
	internal: 500,
};

/** An error that the API turns into its one JSON error shape. */
export class AppError extends Error {
	readonly code: ErrorCode;
	readonly status: number;
	readonly fields?: Record<string, string[]>;
	readonly details?: unknown;

	constructor(
		code: ErrorCode,
		message: string,
		options: { fields?: Record<string, string[]>; details?: unknown } = {},
	) {
		super(message);
		this.code = code;
		this.status = STATUS[code];
		this.fields = options.fields;
		this.details = options.details;
	}
}

/** Field messages keyed by dotted path ("loads.2.va"), from a zod error. */
export function fieldErrors(error: z.ZodError): Record<string, string[]> {
	const out: Record<string, string[]> = {};
	for (const issue of error.issues) {
		const key = issue.path.length ? issue.path.join('.') : '_';
		(out[key] ??= []).push(issue.message);
	}
	return out;
}

export const errors = {
	validation: (error: z.ZodError, message = 'Some fields need attention.') =>
		new AppError('validation', message, { fields: fieldErrors(error) }),
	invalid: (message: string, fields?: Record<string, string[]>) =>
		new AppError('validation', message, { fields }),
	unauthenticated: () => new AppError('unauthenticated', 'Please sign in to continue.'),
	forbidden: (message = 'Your account does not have access to this.') => new AppError('forbidden', message),
	notFound: (what = 'record') => new AppError('not_found', `No such ${what}, or it is not yours to see.`),
	conflict: (message: string, details?: unknown) => new AppError('conflict', message, { details }),
	tooMany: (message: string) => new AppError('too_many_requests', message),
};

/** The one JSON error body: { error: { code, message, fields?, current? } }. */
export function errorBody(err: AppError) {
	return {
		error: {
			code: err.code,
			message: err.message,
			...(err.fields ? { fields: err.fields } : {}),
			...(err.details !== undefined ? { current: err.details } : {}),
		},
	};
}

/** Turns any thrown value into a JSON Response; unknown errors are logged and answered with a generic 500. */
export function errorResponse(err: unknown): Response {
	if (err instanceof AppError) {
		return Response.json(errorBody(err), { status: err.status });
	}
	console.error('[ampledger] unexpected error', err);
	const internal = new AppError(
		'internal',
		'Something went wrong on our side. Nothing was saved; please try again.',
	);
	return Response.json(errorBody(internal), { status: 500 });
}

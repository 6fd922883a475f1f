import type { APIContext, APIRoute } from 'astro';
import type { z } from 'zod';
import { errorResponse, errors } from './errors';

/** Wraps an endpoint so every thrown error becomes the one JSON error shape. */
export function route(handler: (ctx: APIContext) => Promise<Response> | Response): APIRoute {
	return async (ctx) => {
		try {
			return await handler(ctx);
		} catch (err) {
			return errorResponse(err);
		}
	};
}

/** Reads a JSON body and validates it with the entity's schema, or throws a 400 with field messages. */
export async function parseBody<S extends z.ZodType>(request: Request, schema: S): Promise<z.infer<S>> {
	let raw: unknown;
	try {
		raw = await request.json();
	} catch {
		throw errors.invalid('The request body must be JSON.');
	}
	const parsed = schema.safeParse(raw);
	if (!parsed.success) throw errors.validation(parsed.error);
	return parsed.data;
}

export function json(data: unknown, status = 200): Response {
	return Response.json(data, { status });
}

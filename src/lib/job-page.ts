import type { AstroGlobal } from 'astro';
import { assertJobAccess, type JobRef } from './access';
import { db } from './db';
import { AppError } from './errors';

/** The not-found page with a 404 status (a rewrite alone keeps the 200). */
export async function notFoundPage(astro: AstroGlobal): Promise<Response> {
	const page = await astro.rewrite('/404');
	return new Response(page.body, { status: 404, headers: page.headers });
}

/**
 * For a job page's frontmatter: the job when the signed-in user may reach it, or the not-found
 * page's response (404, the same for a missing job and another firm's job).
 */
export async function jobForPage(
	astro: AstroGlobal,
	access: 'read' | 'write' = 'write',
): Promise<JobRef | Response> {
	try {
		return await assertJobAccess(db(), astro.locals.user!, String(astro.params.jobId ?? ''), access);
	} catch (err) {
		if (err instanceof AppError && (err.code === 'not_found' || err.code === 'forbidden')) {
			return notFoundPage(astro);
		}
		throw err;
	}
}

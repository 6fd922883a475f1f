import { defineMiddleware } from 'astro:middleware';
import { getSession } from 'auth-astro/server';
import { db } from './lib/db';
import { errorBody, errors } from './lib/errors';
import { isPublicPath, roleForPath } from './lib/roles';
import { loadCurrentUser } from './lib/repositories/accounts';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);
const isApi = (pathname: string) => pathname.startsWith('/api/');

/** Puts the signed-in user into locals and guards pages (redirect to sign-in) and API routes (401/403 JSON). */
export const onRequest = defineMiddleware(async (context, next) => {
	const { pathname } = context.url;
	if (pathname.startsWith('/api/auth/') || pathname.startsWith('/_astro/')) return next();

	// Astro checks the origin of form posts only; JSON and uploads are checked here, for every API write.
	if (isApi(pathname) && !SAFE_METHODS.has(context.request.method)) {
		const origin = context.request.headers.get('origin');
		if (origin && origin !== context.url.origin) {
			return Response.json(errorBody(errors.forbidden('Requests from other sites are refused.')), {
				status: 403,
			});
		}
	}

	const session = await getSession(context.request);
	const userId = session?.user?.id;
	context.locals.user = userId ? await loadCurrentUser(db(), userId) : null;

	if (isPublicPath(pathname)) return next();

	const user = context.locals.user;
	if (!user) {
		if (isApi(pathname)) return Response.json(errorBody(errors.unauthenticated()), { status: 401 });
		const back = encodeURIComponent(pathname + context.url.search);
		return context.redirect(`/sign-in?next=${back}`, 302);
	}
	const role = roleForPath(pathname);
	if (role && !user.roles.includes(role)) {
		if (isApi(pathname)) return Response.json(errorBody(errors.forbidden()), { status: 403 });
		return context.rewrite('/forbidden');
	}
	return next();
});

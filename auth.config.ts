import Credentials from '@auth/core/providers/credentials';
import { CredentialsSignin } from '@auth/core/errors';
import { defineConfig } from 'auth-astro';
import { db } from './src/lib/db';
import { signInSchema } from './src/lib/schemas/account';
import { checkCredentials } from './src/lib/sign-in';

class InvalidInput extends CredentialsSignin {
	override code = 'invalid_input';
}
class WrongCredentials extends CredentialsSignin {
	override code = 'wrong_credentials';
}
class Throttled extends CredentialsSignin {
	override code = 'throttled';
}

export default defineConfig({
	secret: process.env.AUTH_SECRET,
	trustHost: process.env.AUTH_TRUST_HOST === 'true',
	session: { strategy: 'jwt', maxAge: 60 * 60 * 12 },
	pages: { signIn: '/sign-in', error: '/sign-in' },
	providers: [
		Credentials({
			credentials: { email: { label: 'E-mail' }, password: { label: 'Password', type: 'password' } },
			async authorize(credentials, request) {
				const parsed = signInSchema.safeParse(credentials);
				if (!parsed.success) throw new InvalidInput();
				// src/server.ts sets this header from the socket's address; clients cannot choose it.
				const ip = request.headers.get('x-forwarded-for')?.split(',')[0]?.trim() || 'unknown';
				const outcome = await checkCredentials(db(), parsed.data.email, parsed.data.password, ip);
				if (!outcome.ok) throw outcome.reason === 'throttled' ? new Throttled() : new WrongCredentials();
				return { id: outcome.user.id, email: outcome.user.email, name: outcome.user.name };
			},
		}),
	],
	callbacks: {
		jwt({ token, user }) {
			if (user?.id) token.sub = user.id;
			return token;
		},
		session({ session, token }) {
			if (token.sub && session.user) session.user.id = token.sub;
			return session;
		},
	},
	logger: {
		error(error) {
			// A failed sign-in is an expected answer, not a server fault.
			if ((error as { type?: string }).type === 'CredentialsSignin') return;
			console.error('[auth]', error);
		},
	},
});

import { z } from 'zod';

const email = z
	.string({ error: 'Enter your e-mail address.' })
	.trim()
	.min(1, { error: 'Enter your e-mail address.' })
	.max(254, { error: 'An e-mail address is at most 254 characters.' })
	.pipe(z.email({ error: 'This does not look like an e-mail address (name@example.com).' }))
	.transform((s) => s.toLowerCase());

/** What the sign-in form sends. */
export const signInSchema = z.object({
	email,
	password: z
		.string({ error: 'Enter your password.' })
		.min(1, { error: 'Enter your password.' })
		.max(200, { error: 'A password is at most 200 characters.' }),
});
export type SignIn = z.infer<typeof signInSchema>;

const personName = z
	.string({ error: 'Enter your name.' })
	.trim()
	.min(2, { error: 'Enter your full name (at least 2 characters).' })
	.max(120, { error: 'A name is at most 120 characters.' });

/** What the sign-up form sends: a new contractor firm and its owner. */
export const signUpSchema = z
	.object({
		firmName: z
			.string({ error: 'Enter the firm’s name.' })
			.trim()
			.min(2, { error: 'Enter the firm’s name (at least 2 characters).' })
			.max(160, { error: 'A firm name is at most 160 characters.' }),
		licenceNumber: z
			.string({ error: 'Enter the electrical contractor licence number.' })
			.trim()
			.min(2, { error: 'Enter the electrical contractor licence number.' })
			.max(60, { error: 'A licence number is at most 60 characters.' })
			.regex(/^[A-Za-z0-9][A-Za-z0-9 ./-]*$/, {
				error: 'Use letters, digits, spaces, dots, slashes and hyphens only.',
			}),
		name: personName,
		email,
		password: z
			.string({ error: 'Choose a password.' })
			.min(10, { error: 'Use at least 10 characters for the password.' })
			.max(200, { error: 'A password is at most 200 characters.' }),
		confirmPassword: z.string({ error: 'Type the password again.' }),
	})
	.refine((v) => v.password === v.confirmPassword, {
		path: ['confirmPassword'],
		error: 'The two passwords do not match.',
	});
export type SignUp = z.infer<typeof signUpSchema>;

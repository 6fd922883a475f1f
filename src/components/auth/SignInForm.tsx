import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { SIGN_IN_MESSAGES, signInWithPassword } from '../../lib/client/auth-client';
import { signInSchema } from '../../lib/schemas/account';
import FormField, { fieldAria } from './FormField';

type Input = z.input<typeof signInSchema>;
type Output = z.output<typeof signInSchema>;

export default function SignInForm({ next, initialError }: { next?: string; initialError?: string }) {
	const [message, setMessage] = useState<string | null>(initialError ?? null);
	const {
		register,
		handleSubmit,
		formState: { errors, isSubmitting },
	} = useForm<Input, unknown, Output>({
		resolver: zodResolver(signInSchema),
		defaultValues: { email: '', password: '' },
	});

	const onSubmit = handleSubmit(async (values) => {
		setMessage(null);
		try {
			const result = await signInWithPassword(values.email, values.password);
			if (!result.ok) {
				setMessage(SIGN_IN_MESSAGES[result.code] ?? SIGN_IN_MESSAGES.wrong_credentials!);
				return;
			}
			window.location.href = next && next.startsWith('/') && !next.startsWith('//') ? next : '/start';
		} catch {
			setMessage(SIGN_IN_MESSAGES.server!);
		}
	});

	return (
		<form
			method="post"
			onSubmit={onSubmit}
			noValidate
			className="space-y-4"
			aria-describedby={message ? 'sign-in-message' : undefined}
		>
			{message && (
				<div
					id="sign-in-message"
					role="alert"
					className="rounded-md border border-signal-violation/40 bg-red-50 p-3 text-sm text-signal-violation"
				>
					{message}
				</div>
			)}
			<FormField id="email" label="E-mail" error={errors.email?.message}>
				<input
					{...register('email')}
					{...fieldAria('email', errors.email?.message)}
					type="email"
					autoComplete="username"
					className="field-input"
				/>
			</FormField>
			<FormField id="password" label="Password" error={errors.password?.message}>
				<input
					{...register('password')}
					{...fieldAria('password', errors.password?.message)}
					type="password"
					autoComplete="current-password"
					className="field-input"
				/>
			</FormField>
			<button type="submit" className="btn-primary w-full" disabled={isSubmitting}>
				{isSubmitting ? 'Signing in…' : 'Sign in'}
			</button>
		</form>
	);
}

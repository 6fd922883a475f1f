import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { signInWithPassword } from '../../lib/client/auth-client';
import { signUpSchema } from '../../lib/schemas/account';
import FormField, { fieldAria } from './FormField';

type Input = z.input<typeof signUpSchema>;
type Output = z.output<typeof signUpSchema>;
type Field = keyof Input;

const FIELDS: { name: Field; label: string; type: string; autoComplete: string; hint?: string }[] = [
	{ name: 'firmName', label: 'Firm name', type: 'text', autoComplete: 'organization' },
	{
		name: 'licenceNumber',
		label: 'Electrical contractor licence number',
		type: 'text',
		autoComplete: 'off',
		hint: 'Printed on the permit packet cover sheet.',
	},
	{ name: 'name', label: 'Your name', type: 'text', autoComplete: 'name' },
	{ name: 'email', label: 'E-mail', type: 'email', autoComplete: 'email' },
	{
		name: 'password',
		label: 'Password',
		type: 'password',
		autoComplete: 'new-password',
		hint: 'At least 10 characters.',
	},
	{ name: 'confirmPassword', label: 'Password again', type: 'password', autoComplete: 'new-password' },
];

export default function SignUpForm() {
	const [message, setMessage] = useState<string | null>(null);
	const {
		register,
		handleSubmit,
		setError,
		formState: { errors, isSubmitting },
	} = useForm<Input, unknown, Output>({
		resolver: zodResolver(signUpSchema),
		defaultValues: {
			firmName: '',
			licenceNumber: '',
			name: '',
			email: '',
			password: '',
			confirmPassword: '',
		},
	});

	const onSubmit = handleSubmit(async (values) => {
		setMessage(null);
		try {
			const res = await fetch('/api/sign-up', {
				method: 'POST',
				headers: { 'Content-Type': 'application/json' },
				body: JSON.stringify(values),
			});
			if (!res.ok) {
				const body = (await res.json().catch(() => null)) as {
					error?: { message?: string; fields?: Record<string, string[]> };
				} | null;
				for (const [field, msgs] of Object.entries(body?.error?.fields ?? {})) {
					if (FIELDS.some((f) => f.name === field)) setError(field as Field, { message: msgs[0] });
				}
				setMessage(body?.error?.message ?? 'The firm could not be registered. Please try again.');
				return;
			}
			const signedIn = await signInWithPassword(values.email, values.password);
			window.location.href = signedIn.ok ? '/contractor?welcome=1' : '/sign-in';
		} catch {
			setMessage('We could not reach the server. Your entries are still here; try again.');
		}
	});

	return (
		<form method="post" onSubmit={onSubmit} noValidate className="space-y-4">
			{message && (
				<div
					role="alert"
					className="rounded-md border border-signal-violation/40 bg-red-50 p-3 text-sm text-signal-violation"
				>
					{message}
				</div>
			)}
			{FIELDS.map((f) => (
				<FormField key={f.name} id={f.name} label={f.label} error={errors[f.name]?.message} hint={f.hint}>
					<input
						{...register(f.name)}
						{...fieldAria(f.name, errors[f.name]?.message, f.hint)}
						type={f.type}
						autoComplete={f.autoComplete}
						className="field-input"
					/>
				</FormField>
			))}
			<button type="submit" className="btn-primary w-full" disabled={isSubmitting}>
				{isSubmitting ? 'Registering…' : 'Register the firm'}
			</button>
		</form>
	);
}

import type { ReactNode } from 'react';

interface Props {
	id: string;
	label: string;
	error?: string;
	hint?: string;
	children: ReactNode;
}

/** A labelled form control with its hint and its message, tied together for screen readers. */
export default function FormField({ id, label, error, hint, children }: Props) {
	return (
		<div>
			<label htmlFor={id} className="field-label">
				{label}
			</label>
			{children}
			{hint && !error && (
				<p id={`${id}-hint`} className="mt-1 text-sm text-ink-500">
					{hint}
				</p>
			)}
			{error && (
				<p id={`${id}-error`} role="alert" className="field-error">
					{error}
				</p>
			)}
		</div>
	);
}

/** aria attributes for an input inside FormField. */
export function fieldAria(id: string, error?: string, hint?: string) {
	return {
		id,
		'aria-invalid': error ? true : undefined,
		'aria-describedby': error ? `${id}-error` : hint ? `${id}-hint` : undefined,
	} as const;
}

import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ApiError, messageOf } from '../../lib/client/api-client';

/** `setValueAs` for a number input: '' becomes null (or undefined), text that is not a number stays text for the schema to name. */
export const asNumberOrNull = (v: unknown) =>
	v === '' || v === null || v === undefined ? null : Number.isNaN(Number(v)) ? v : Number(v);
export const asNumber = (v: unknown) =>
	v === '' || v === null || v === undefined ? undefined : Number.isNaN(Number(v)) ? v : Number(v);

/**
 * Puts the server's field messages onto the form's fields (known names only) and returns the
 * messages that belong to no field, so that nothing the server said is lost.
 */
export function applyServerErrors<T extends FieldValues>(
	err: unknown,
	setError: UseFormSetError<T>,
	known: readonly string[],
): string[] {
	if (!(err instanceof ApiError)) return [];
	const rest: string[] = [];
	for (const [path, msgs] of Object.entries(err.fields)) {
		const msg = msgs[0];
		if (!msg) continue;
		const top = path.split('.')[0] ?? path;
		if (known.includes(path) || known.includes(top))
			setError((known.includes(path) ? path : top) as Path<T>, { type: 'server', message: msg });
		else rest.push(path === '_' ? msg : `${path}: ${msg}`);
	}
	return rest;
}

/** The form's notice for a failed save: the server's message and whatever it said about no field shown. */
export function formErrorMessage<T extends FieldValues>(
	err: unknown,
	setError: UseFormSetError<T>,
	known: readonly string[],
): string {
	return [messageOf(err), ...applyServerErrors(err, setError, known)].join(' ');
}

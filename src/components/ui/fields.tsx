import {
	get,
	type FieldValues,
	type FieldErrors,
	type Path,
	type RegisterOptions,
	type UseFormRegister,
} from 'react-hook-form';
import FormField, { fieldAria } from '../auth/FormField';
import { asNumber, asNumberOrNull } from '../jobs/form-helpers';

/** The parts of a react-hook-form form that a field needs (`useForm()`'s return value has them). */
export interface FormLike<T extends FieldValues> {
	register: UseFormRegister<T>;
	formState: { errors: FieldErrors<NoInfer<T>> };
}

interface FieldProps<T extends FieldValues> {
	form: FormLike<T>;
	name: Path<T>;
	id: string;
	label: string;
	hint?: string;
}

/** One `<option>`: its value and what the user reads. */
export type Option = readonly [value: string | number, label: string];

/** Options from a list of values and a way to word each. */
export function optionsOf<V extends string | number>(
	values: readonly V[],
	label: (v: V) => string,
): Option[] {
	return values.map((v) => [v, label(v)] as const);
}

/** The message react-hook-form holds for a field (nested names such as `conductor.size` too). */
export function errorOf<T extends FieldValues>(form: FormLike<T>, name: Path<T>): string | undefined {
	return (get(form.formState.errors, name) as { message?: string } | undefined)?.message;
}

/** A registered control inside FormField, with its error and hint tied to it for screen readers. */
function Field<T extends FieldValues>({
	form,
	name,
	id,
	label,
	hint,
	render,
}: FieldProps<T> & { render: (aria: ReturnType<typeof fieldAria>) => React.ReactNode }) {
	const error = errorOf(form, name);
	return (
		<FormField id={id} label={label} error={error} hint={hint}>
			{render(fieldAria(id, error, hint))}
		</FormField>
	);
}

/** A one-line text input. */
export function TextField<T extends FieldValues>({
	type = 'text',
	placeholder,
	autoComplete,
	...props
}: FieldProps<T> & { type?: 'text' | 'email'; placeholder?: string; autoComplete?: string }) {
	return (
		<Field
			{...props}
			render={(aria) => (
				<input
					type={type}
					{...props.form.register(props.name)}
					{...aria}
					className="field-input"
					placeholder={placeholder}
					autoComplete={autoComplete}
				/>
			)}
		/>
	);
}

/** A several-line text box. */
export function TextAreaField<T extends FieldValues>({
	rows = 3,
	...props
}: FieldProps<T> & { rows?: number }) {
	return (
		<Field
			{...props}
			render={(aria) => (
				<textarea rows={rows} {...props.form.register(props.name)} {...aria} className="field-input" />
			)}
		/>
	);
}

/**
 * A number typed as text: an empty box is `undefined` (the schema says it is required) or, with
 * `emptyIsNull`, `null`; text that is not a number reaches the schema as it is, to be named there.
 */
export function NumberField<T extends FieldValues>({
	whole = false,
	emptyIsNull = false,
	...props
}: FieldProps<T> & { whole?: boolean; emptyIsNull?: boolean }) {
	const setValueAs = emptyIsNull ? asNumberOrNull : asNumber;
	return (
		<Field
			{...props}
			render={(aria) => (
				<input
					inputMode={whole ? 'numeric' : 'decimal'}
					{...props.form.register(props.name, { setValueAs } as RegisterOptions<T, Path<T>>)}
					{...aria}
					className="field-input"
				/>
			)}
		/>
	);
}

/**
 * A drop-down list. `numeric` turns the chosen value back into a number; `empty` adds a first
 * option with the value '' (e.g. "Choose…"); `setValueAs` converts the value some other way.
 */
export function SelectField<T extends FieldValues>({
	options,
	empty,
	numeric = false,
	setValueAs,
	disabled,
	...props
}: FieldProps<T> & {
	options: readonly Option[];
	empty?: string;
	numeric?: boolean;
	setValueAs?: (v: unknown) => unknown;
	disabled?: boolean;
}) {
	const convert = setValueAs ?? (numeric ? asNumber : undefined);
	return (
		<Field
			{...props}
			render={(aria) => (
				<select
					{...props.form.register(
						props.name,
						(convert ? { setValueAs: convert } : undefined) as RegisterOptions<T, Path<T>> | undefined,
					)}
					{...aria}
					className="field-input"
					disabled={disabled}
				>
					{empty !== undefined && <option value="">{empty}</option>}
					{options.map(([value, label]) => (
						<option key={value} value={value}>
							{label}
						</option>
					))}
				</select>
			)}
		/>
	);
}

import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { messageOf } from '../../lib/client/api-client';
import { ROOM_TYPES } from '../../lib/electrical/schema';
import { roomInputSchema } from '../../lib/schemas/room';
import FormField, { fieldAria } from '../auth/FormField';
import { applyServerErrors, asNumber, asNumberOrNull } from '../jobs/form-helpers';
import Notice from '../ui/Notice';

type Input = z.input<typeof roomInputSchema>;
export type RoomValues = z.output<typeof roomInputSchema>;

export const ROOM_TYPE_LABELS: Record<(typeof ROOM_TYPES)[number], string> = {
	kitchen: 'Kitchen',
	bathroom: 'Bathroom',
	bedroom: 'Bedroom',
	living: 'Living room',
	dining: 'Dining room',
	hallway: 'Hallway',
	closet: 'Closet',
	laundry: 'Laundry area',
	garage: 'Garage',
	basement: 'Basement',
	outdoor: 'Outdoors',
	attic: 'Attic',
	'crawl-space': 'Crawl space',
	other: 'Other',
};

const FIELDS = ['name', 'type', 'floor', 'areaFt2', 'inFloorArea'] as const;

interface Props {
	idPrefix: string;
	initial?: Partial<Input>;
	submitLabel: string;
	onSubmit: (values: RoomValues) => Promise<void>;
	onCancel?: () => void;
}

/** Add or edit a room; the schema is the one POST/PATCH /api/rooms use. */
export default function RoomForm({ idPrefix, initial, submitLabel, onSubmit, onCancel }: Props) {
	const [message, setMessage] = useState<string | null>(null);
	const {
		register,
		handleSubmit,
		setError,
		reset,
		formState: { errors, isSubmitting },
	} = useForm<Input, unknown, RoomValues>({
		resolver: zodResolver(roomInputSchema),
		defaultValues: {
			name: '',
			type: 'bedroom',
			floor: 1,
			areaFt2: undefined as never,
			inFloorArea: null,
			...initial,
		},
	});
	const submit = handleSubmit(async (values) => {
		setMessage(null);
		try {
			await onSubmit(values);
			if (!initial) reset();
		} catch (err) {
			const rest = applyServerErrors(err, setError, FIELDS);
			setMessage([messageOf(err), ...rest].join(' '));
		}
	});
	const id = (k: string) => `${idPrefix}-${k}`;
	const e = (k: (typeof FIELDS)[number]) => errors[k]?.message as string | undefined;
	return (
		<form
			onSubmit={submit}
			noValidate
			aria-label={submitLabel}
			className="grid items-start gap-3 sm:grid-cols-[2fr_1.5fr_0.8fr_1fr_auto]"
		>
			{message && (
				<div className="sm:col-span-5">
					<Notice tone="error">{message}</Notice>
				</div>
			)}
			<FormField id={id('name')} label="Room name" error={e('name')}>
				<input {...register('name')} {...fieldAria(id('name'), e('name'))} className="field-input" />
			</FormField>
			<FormField id={id('type')} label="Room type" error={e('type')}>
				<select {...register('type')} {...fieldAria(id('type'), e('type'))} className="field-input">
					{ROOM_TYPES.map((t) => (
						<option key={t} value={t}>
							{ROOM_TYPE_LABELS[t]}
						</option>
					))}
				</select>
			</FormField>
			<FormField id={id('floor')} label="Floor" error={e('floor')}>
				<input
					inputMode="numeric"
					{...register('floor', { setValueAs: asNumber })}
					{...fieldAria(id('floor'), e('floor'))}
					className="field-input"
				/>
			</FormField>
			<FormField id={id('areaFt2')} label="Area (ft²)" error={e('areaFt2')}>
				<input
					inputMode="decimal"
					{...register('areaFt2', { setValueAs: asNumberOrNull })}
					{...fieldAria(id('areaFt2'), e('areaFt2'))}
					className="field-input"
				/>
			</FormField>
			<div className="flex gap-2 sm:pt-6">
				<button type="submit" className="btn-primary" disabled={isSubmitting}>
					{isSubmitting ? 'Saving…' : submitLabel}
				</button>
				{onCancel && (
					<button type="button" className="btn-quiet" onClick={onCancel}>
						Cancel
					</button>
				)}
			</div>
		</form>
	);
}

import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { ROOM_TYPES } from '../../lib/electrical/schema';
import { roomInputSchema } from '../../lib/schemas/room';
import { formErrorMessage } from '../jobs/form-helpers';
import { NumberField, optionsOf, SelectField, TextField } from '../ui/fields';
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
	const form = useForm<Input, unknown, RoomValues>({
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
	const {
		handleSubmit,
		setError,
		reset,
		formState: { isSubmitting },
	} = form;
	const submit = handleSubmit(async (values) => {
		setMessage(null);
		try {
			await onSubmit(values);
			if (!initial) reset();
		} catch (err) {
			setMessage(formErrorMessage(err, setError, FIELDS));
		}
	});
	const id = (k: string) => `${idPrefix}-${k}`;
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
			<TextField form={form} name="name" id={id('name')} label="Room name" />
			<SelectField
				form={form}
				name="type"
				id={id('type')}
				label="Room type"
				options={optionsOf(ROOM_TYPES, (t) => ROOM_TYPE_LABELS[t])}
			/>
			<NumberField form={form} name="floor" id={id('floor')} label="Floor" whole />
			<NumberField form={form} name="areaFt2" id={id('areaFt2')} label="Area (ft²)" emptyIsNull />
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

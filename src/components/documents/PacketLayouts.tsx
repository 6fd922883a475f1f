import { useEffect, useId, useState } from 'react';
import { useForm } from 'react-hook-form';
import { api, ApiError } from '../../lib/client/api-client';
import { lightingLayoutInputSchema } from '../../lib/schemas/lighting-layout';
import FormField, { fieldAria } from '../auth/FormField';
import Notice from '../ui/Notice';

interface Layout {
	id: string;
	title: string;
	roomName: string | null;
	input: { lengthFt: number; widthFt: number; ceilingHeightFt: number; fixtureDiameterIn: number };
}
interface Room {
	id: string;
	name: string;
}
interface FormValues {
	title: string;
	roomId: string;
	lengthFt: string;
	widthFt: string;
	ceilingHeightFt: string;
	fixtureDiameterIn: string;
	joists: 'none' | 'along-length' | 'along-width';
	joistSpacingIn: string;
	firstOffsetIn: string;
}

const num = (v: string) => (v.trim() === '' ? undefined : Number(v));
// Form field names by the schema's paths, so server and client messages land beside the right input.
const PATHS: Record<string, keyof FormValues> = {
	title: 'title',
	roomId: 'roomId',
	'input.lengthFt': 'lengthFt',
	'input.widthFt': 'widthFt',
	'input.ceilingHeightFt': 'ceilingHeightFt',
	'input.fixtureDiameterIn': 'fixtureDiameterIn',
	'input.joists.spacingIn': 'joistSpacingIn',
	'input.joists.firstOffsetIn': 'firstOffsetIn',
};

/** The recessed-light layouts the permit packet draws to scale: list, add, remove. */
export default function PacketLayouts({ jobId }: { jobId: string }) {
	const [layouts, setLayouts] = useState<Layout[] | null>(null);
	const [rooms, setRooms] = useState<Room[]>([]);
	const [message, setMessage] = useState<string | null>(null);
	const [open, setOpen] = useState(false);
	const uid = useId();
	const {
		register,
		handleSubmit,
		setError,
		reset,
		watch,
		formState: { errors, isSubmitting },
	} = useForm<FormValues>({
		defaultValues: {
			title: '',
			roomId: '',
			lengthFt: '',
			widthFt: '',
			ceilingHeightFt: '8',
			fixtureDiameterIn: '6',
			joists: 'none',
			joistSpacingIn: '16',
			firstOffsetIn: '16',
		},
	});

	useEffect(() => {
		api<{ items: Layout[] }>(`/api/jobs/${jobId}/lighting-layouts`)
			.then((r) => setLayouts(r.items))
			.catch(() => setLayouts([]));
		api<{ items: Room[] }>(`/api/jobs/${jobId}/rooms`)
			.then((r) => setRooms(r.items))
			.catch(() => setRooms([]));
	}, [jobId]);

	const onSubmit = handleSubmit(async (v) => {
		setMessage(null);
		const body = {
			title: v.title,
			roomId: v.roomId || null,
			input: {
				lengthFt: num(v.lengthFt),
				widthFt: num(v.widthFt),
				ceilingHeightFt: num(v.ceilingHeightFt),
				fixtureDiameterIn: num(v.fixtureDiameterIn),
				joists:
					v.joists === 'none'
						? null
						: { direction: v.joists, spacingIn: num(v.joistSpacingIn), firstOffsetIn: num(v.firstOffsetIn) },
			},
		};
		const parsed = lightingLayoutInputSchema.safeParse(body);
		if (!parsed.success) {
			for (const issue of parsed.error.issues) {
				const field = PATHS[issue.path.join('.')];
				if (field) setError(field, { message: issue.message });
			}
			setMessage('Some fields need attention.');
			return;
		}
		try {
			const { layout } = await api<{ layout: Layout }>(`/api/jobs/${jobId}/lighting-layouts`, {
				method: 'POST',
				body: parsed.data,
			});
			setLayouts((l) => [...(l ?? []), layout]);
			reset();
			setOpen(false);
		} catch (err) {
			if (err instanceof ApiError) {
				for (const [path, msgs] of Object.entries(err.fields)) {
					const field = PATHS[path];
					if (field) setError(field, { message: msgs[0] });
				}
				setMessage(err.message);
			} else setMessage('The layout could not be saved. Nothing was lost: try again.');
		}
	});

	async function remove(id: string) {
		try {
			await api(`/api/lighting-layouts/${id}`, { method: 'DELETE' });
			setLayouts((l) => (l ?? []).filter((x) => x.id !== id));
		} catch (err) {
			setMessage(err instanceof ApiError ? err.message : 'The layout could not be removed.');
		}
	}

	const e = (k: keyof FormValues) => errors[k]?.message;
	const id = (k: string) => `${uid}-${k}`;
	const numberField = (k: keyof FormValues, label: string, hint?: string) => (
		<FormField id={id(k)} label={label} error={e(k)} hint={hint}>
			<input {...register(k)} {...fieldAria(id(k), e(k), hint)} inputMode="decimal" className="field-input" />
		</FormField>
	);

	return (
		<div>
			<h3 className="font-semibold text-ink-900">Lighting layouts in the packet</h3>
			<p className="text-sm text-ink-600">
				Each is drawn to scale on its own sheet, fixtures and joists shown.
			</p>
			{layouts && layouts.length === 0 && <p className="mt-1 text-sm text-ink-600">None yet.</p>}
			<ul className="mt-1 divide-y divide-ink-100 text-sm">
				{layouts?.map((l) => (
					<li key={l.id} className="flex items-center justify-between gap-2 py-1.5">
						<span>
							<span className="font-semibold">{l.title}</span> · {l.roomName ?? 'no room'} ·{' '}
							{l.input.lengthFt} × {l.input.widthFt} ft
						</span>
						<button
							type="button"
							className="btn-quiet px-2 py-1"
							onClick={() => void remove(l.id)}
							aria-label={`Remove ${l.title}`}
						>
							Remove
						</button>
					</li>
				))}
			</ul>
			{!open && (
				<button type="button" className="btn-quiet mt-2" onClick={() => setOpen(true)}>
					Add a layout
				</button>
			)}
			{open && (
				<form
					onSubmit={onSubmit}
					noValidate
					className="mt-3 grid gap-3 rounded-md border border-ink-200 p-3 sm:grid-cols-2"
					aria-label="New lighting layout"
				>
					{message && (
						<div className="sm:col-span-2">
							<Notice tone="error">{message}</Notice>
						</div>
					)}
					<FormField id={id('title')} label="Name" error={e('title')}>
						<input {...register('title')} {...fieldAria(id('title'), e('title'))} className="field-input" />
					</FormField>
					<FormField id={id('roomId')} label="Room" error={e('roomId')}>
						<select {...register('roomId')} {...fieldAria(id('roomId'), e('roomId'))} className="field-input">
							<option value="">No room</option>
							{rooms.map((r) => (
								<option key={r.id} value={r.id}>
									{r.name}
								</option>
							))}
						</select>
					</FormField>
					{numberField('lengthFt', 'Room length, ft')}
					{numberField('widthFt', 'Room width, ft')}
					{numberField('ceilingHeightFt', 'Ceiling height, ft')}
					{numberField('fixtureDiameterIn', 'Fixture hole diameter, in')}
					<FormField id={id('joists')} label="Ceiling joists" error={e('joists')}>
						<select {...register('joists')} {...fieldAria(id('joists'), e('joists'))} className="field-input">
							<option value="none">Not considered</option>
							<option value="along-length">Run along the length</option>
							<option value="along-width">Run along the width</option>
						</select>
					</FormField>
					{watch('joists') !== 'none' && (
						<>
							{numberField('joistSpacingIn', 'Joist spacing, in on centre')}
							{numberField('firstOffsetIn', 'First joist from the wall, in')}
						</>
					)}
					<div className="flex gap-2 sm:col-span-2">
						<button type="submit" className="btn-primary" disabled={isSubmitting}>
							{isSubmitting ? 'Saving…' : 'Save the layout'}
						</button>
						<button type="button" className="btn-quiet" onClick={() => setOpen(false)}>
							Cancel
						</button>
					</div>
				</form>
			)}
		</div>
	);
}

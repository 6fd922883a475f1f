import { useEffect, useRef, useState } from 'react';
import { api, firstFieldMessages, messageOf } from '../../lib/client/api-client';
import { useAction } from '../../lib/client/use-action';
import { useResource } from '../../lib/client/use-resource';
import { fieldErrors } from '../../lib/errors';
import type { InspectionRecord } from '../../lib/repositories/inspections';
import {
	INSPECTION_KIND_LABELS,
	INSPECTION_KINDS,
	INSPECTION_STATUS_LABELS,
	inspectionItemAnswerSchema,
	inspectionRequestSchema,
	inspectionResultSchema,
	inspectionScheduleSchema,
	lastBookableIso,
	MAX_PREFERRED_DATES,
	todayIso,
	type InspectionKind,
} from '../../lib/schemas/inspection';
import { JOB_STATUS_LABELS, type JobStatus } from '../../lib/workflow/status';
import FormField from '../auth/FormField';
import ConfirmDialog from '../ui/ConfirmDialog';
import LoadState from '../ui/LoadState';
import Notice from '../ui/Notice';

interface Listing {
	jobStatus: JobStatus;
	inspections: InspectionRecord[];
	requestBlocks: Record<InspectionKind, string | null>;
	sides: { contractor: boolean; inspector: boolean };
}

interface Props {
	jobId: string;
	/** Who looks: the firm (requests, answers items), the inspector (schedules, records), or a reader. */
	mode: 'contractor' | 'inspector' | 'readonly';
	/** Told the job's status whenever the inspections are (re)read, so the page around can show it too. */
	onStatus?: (status: JobStatus) => void;
}

const STATUS_TONES: Record<string, string> = {
	requested: 'bg-blue-50 text-signal-note',
	scheduled: 'bg-amber-50 text-ink-900',
	passed: 'bg-green-50 text-signal-ok',
	failed: 'bg-red-50 text-signal-violation',
	cancelled: 'bg-ink-100 text-ink-600',
};

const dateText = (iso: string) =>
	new Date(`${iso}T12:00:00Z`).toLocaleDateString('en-US', {
		weekday: 'short',
		month: 'short',
		day: 'numeric',
		year: 'numeric',
		timeZone: 'UTC',
	});

/** Field messages of a zod result, first message per field, keyed by dotted path. */
function messages(error: Parameters<typeof fieldErrors>[0]): Record<string, string> {
	return Object.fromEntries(Object.entries(fieldErrors(error)).map(([k, v]) => [k, v[0]!]));
}

function RequestForm({ jobId, listing, onDone }: { jobId: string; listing: Listing; onDone: () => void }) {
	const open = INSPECTION_KINDS.filter((k) => listing.requestBlocks[k] === null);
	const [kind, setKind] = useState<InspectionKind>(open[0] ?? 'rough-in');
	const [dates, setDates] = useState<string[]>(['', '', '']);
	const [note, setNote] = useState('');
	const [errors, setErrors] = useState<Record<string, string>>({});
	const [failure, setFailure] = useState<string | null>(null);
	const [busy, setBusy] = useState(false);

	const submit = async (e: React.FormEvent) => {
		e.preventDefault();
		setFailure(null);
		const body = { kind, preferredDates: dates.filter(Boolean), note };
		const parsed = inspectionRequestSchema.safeParse(body);
		if (!parsed.success) {
			setErrors(messages(parsed.error));
			return;
		}
		setErrors({});
		setBusy(true);
		try {
			await api(`/api/jobs/${jobId}/inspections`, { method: 'POST', body: parsed.data });
			setDates(['', '', '']);
			setNote('');
			onDone();
		} catch (err) {
			setErrors(firstFieldMessages(err));
			setFailure(messageOf(err));
		} finally {
			setBusy(false);
		}
	};

	if (open.length === 0) {
		return (
			<div className="rounded-md bg-ink-50 p-3 text-sm text-ink-700" data-testid="request-blocked">
				{INSPECTION_KINDS.map((k) => (
					<p key={k}>
						<span className="font-semibold">{INSPECTION_KIND_LABELS[k]}:</span> {listing.requestBlocks[k]}
					</p>
				))}
			</div>
		);
	}
	const dateError =
		errors.preferredDates ?? Object.entries(errors).find(([k]) => k.startsWith('preferredDates.'))?.[1];
	return (
		<form
			onSubmit={submit}
			aria-label="Request an inspection"
			className="space-y-3 rounded-md bg-ink-50 p-3"
			noValidate
		>
			<div className="grid gap-3 sm:grid-cols-[1fr_2fr]">
				<FormField id="inspection-kind" label="Inspection" error={errors.kind}>
					<select
						id="inspection-kind"
						className="field-input"
						value={kind}
						onChange={(e) => setKind(e.target.value as InspectionKind)}
					>
						{open.map((k) => (
							<option key={k} value={k}>
								{INSPECTION_KIND_LABELS[k]}
							</option>
						))}
					</select>
				</FormField>
				<fieldset>
					<legend className="field-label">Preferred dates (one to {MAX_PREFERRED_DATES})</legend>
					<div className="flex flex-wrap gap-2">
						{dates.map((d, i) => (
							<input
								key={i}
								type="date"
								aria-label={`Preferred date ${i + 1}`}
								className="field-input w-auto"
								min={todayIso()}
								max={lastBookableIso()}
								value={d}
								aria-invalid={!!dateError}
								onChange={(e) => setDates(dates.map((x, j) => (j === i ? e.target.value : x)))}
							/>
						))}
					</div>
					{dateError && <p className="field-error">{dateError}</p>}
				</fieldset>
			</div>
			<FormField
				id="inspection-note"
				label="Note for the inspector (access, contact on site)"
				error={errors.note}
			>
				<textarea
					id="inspection-note"
					className="field-input"
					rows={2}
					maxLength={4000}
					value={note}
					onChange={(e) => setNote(e.target.value)}
				/>
			</FormField>
			{INSPECTION_KINDS.filter((k) => listing.requestBlocks[k] !== null).map((k) => (
				<p key={k} className="text-sm text-ink-600">
					<span className="font-semibold">{INSPECTION_KIND_LABELS[k]}:</span> {listing.requestBlocks[k]}
				</p>
			))}
			{failure && <Notice tone="error">{failure}</Notice>}
			<button type="submit" className="btn-primary" disabled={busy}>
				{busy ? 'Sending…' : 'Request the inspection'}
			</button>
		</form>
	);
}

function AnswerBox({ itemId, initial, onDone }: { itemId: string; initial: string; onDone: () => void }) {
	const [answer, setAnswer] = useState(initial);
	const { busy, error, setError, run } = useAction();
	const submit = async (e: React.FormEvent) => {
		e.preventDefault();
		const parsed = inspectionItemAnswerSchema.safeParse({ answer });
		if (!parsed.success) {
			setError(messages(parsed.error).answer ?? 'Write what was corrected.');
			return;
		}
		if (await run(() => api(`/api/inspection-items/${itemId}/answer`, { method: 'POST', body: parsed.data })))
			onDone();
	};
	return (
		<form
			onSubmit={submit}
			className="mt-2 flex flex-wrap items-start gap-2"
			aria-label="Answer the correction item"
		>
			<label className="sr-only" htmlFor={`answer-${itemId}`}>
				What was corrected
			</label>
			<textarea
				id={`answer-${itemId}`}
				className="field-input min-w-[16rem] flex-1"
				rows={2}
				maxLength={4000}
				placeholder="What was corrected, and how"
				value={answer}
				aria-invalid={!!error}
				onChange={(e) => setAnswer(e.target.value)}
			/>
			<button type="submit" className="btn-quiet" disabled={busy}>
				{busy ? 'Saving…' : initial ? 'Save the answer' : 'Answer'}
			</button>
			{error && <p className="field-error w-full">{error}</p>}
		</form>
	);
}

function ScheduleForm({ inspection, onDone }: { inspection: InspectionRecord; onDone: () => void }) {
	const [date, setDate] = useState(inspection.scheduledFor ?? inspection.preferredDates[0] ?? '');
	const { busy, error, setError, run } = useAction();
	const submit = async (e: React.FormEvent) => {
		e.preventDefault();
		const parsed = inspectionScheduleSchema.safeParse({ scheduledFor: date });
		if (!parsed.success) {
			setError(messages(parsed.error).scheduledFor ?? 'Choose a date.');
			return;
		}
		if (await run(() => api(`/api/inspections/${inspection.id}`, { method: 'PATCH', body: parsed.data })))
			onDone();
	};
	return (
		<form
			onSubmit={submit}
			className="flex flex-wrap items-end gap-2"
			aria-label="Schedule the inspection"
			noValidate
		>
			<FormField id={`schedule-${inspection.id}`} label="Date of the visit" error={error ?? undefined}>
				<input
					id={`schedule-${inspection.id}`}
					type="date"
					className="field-input w-auto"
					min={todayIso()}
					max={lastBookableIso()}
					value={date}
					onChange={(e) => setDate(e.target.value)}
				/>
			</FormField>
			<button type="submit" className="btn-quiet mb-1" disabled={busy}>
				{inspection.scheduledFor ? 'Move the date' : 'Schedule'}
			</button>
		</form>
	);
}

async function uploadPhotos(inspectionId: string, files: FileList, caption: string): Promise<void> {
	const body = new FormData();
	body.append('caption', caption);
	for (const f of Array.from(files)) body.append('files', f);
	await api(`/api/inspections/${inspectionId}/photos`, { method: 'POST', body });
}

function PhotoUpload({ inspectionId, onDone }: { inspectionId: string; onDone: () => void }) {
	const ref = useRef<HTMLInputElement>(null);
	const [caption, setCaption] = useState('');
	const { busy, error, setError, run } = useAction();
	const submit = async (e: React.FormEvent) => {
		e.preventDefault();
		const files = ref.current?.files;
		if (!files || files.length === 0) {
			setError('Choose at least one PNG or JPEG photo.');
			return;
		}
		if (!(await run(() => uploadPhotos(inspectionId, files, caption)))) return;
		if (ref.current) ref.current.value = '';
		setCaption('');
		onDone();
	};
	return (
		<form onSubmit={submit} className="flex flex-wrap items-end gap-2" aria-label="Add photos">
			<FormField id={`photos-${inspectionId}`} label="Photos (PNG or JPEG)">
				<input
					id={`photos-${inspectionId}`}
					ref={ref}
					type="file"
					multiple
					accept="image/png,image/jpeg"
					className="block text-sm"
				/>
			</FormField>
			<FormField id={`caption-${inspectionId}`} label="Caption">
				<input
					id={`caption-${inspectionId}`}
					className="field-input"
					maxLength={200}
					value={caption}
					onChange={(e) => setCaption(e.target.value)}
				/>
			</FormField>
			<button type="submit" className="btn-quiet mb-1" disabled={busy}>
				{busy ? 'Uploading…' : 'Add photos'}
			</button>
			{error && <p className="field-error w-full">{error}</p>}
		</form>
	);
}

function ResultForm({ inspection, onDone }: { inspection: InspectionRecord; onDone: () => void }) {
	const [result, setResult] = useState<'pass' | 'fail' | ''>('');
	const [notes, setNotes] = useState('');
	const [items, setItems] = useState('');
	const photos = useRef<HTMLInputElement>(null);
	const [errors, setErrors] = useState<Record<string, string>>({});
	const [failure, setFailure] = useState<string | null>(null);
	const [busy, setBusy] = useState(false);
	const submit = async (e: React.FormEvent) => {
		e.preventDefault();
		setFailure(null);
		const body = {
			result,
			notes,
			items:
				result === 'fail'
					? items
							.split('\n')
							.map((s) => s.trim())
							.filter(Boolean)
					: [],
		};
		const parsed = inspectionResultSchema.safeParse(body);
		if (!parsed.success) {
			setErrors(messages(parsed.error));
			return;
		}
		setErrors({});
		setBusy(true);
		try {
			await api(`/api/inspections/${inspection.id}/result`, { method: 'POST', body: parsed.data });
			const files = photos.current?.files;
			if (files && files.length > 0) {
				try {
					await uploadPhotos(inspection.id, files, '');
				} catch (err) {
					setFailure(`The result is recorded, but the photos were not: ${messageOf(err)}`);
				}
			}
			onDone();
		} catch (err) {
			setErrors(firstFieldMessages(err));
			setFailure(messageOf(err));
		} finally {
			setBusy(false);
		}
	};
	const itemsError = errors.items ?? Object.entries(errors).find(([k]) => k.startsWith('items.'))?.[1];
	return (
		<form
			onSubmit={submit}
			aria-label="Record the result"
			className="space-y-3 rounded-md bg-ink-50 p-3"
			noValidate
		>
			<fieldset>
				<legend className="field-label">Result</legend>
				<div className="flex gap-4">
					{(['pass', 'fail'] as const).map((r) => (
						<label key={r} className="inline-flex items-center gap-2 text-sm font-semibold">
							<input
								type="radio"
								name={`result-${inspection.id}`}
								value={r}
								checked={result === r}
								onChange={() => setResult(r)}
							/>
							{r === 'pass' ? 'Passed' : 'Failed: corrections needed'}
						</label>
					))}
				</div>
				{errors.result && <p className="field-error">{errors.result}</p>}
			</fieldset>
			<FormField id={`notes-${inspection.id}`} label="Notes" error={errors.notes}>
				<textarea
					id={`notes-${inspection.id}`}
					className="field-input"
					rows={2}
					maxLength={4000}
					value={notes}
					onChange={(e) => setNotes(e.target.value)}
				/>
			</FormField>
			{result === 'fail' && (
				<FormField id={`items-${inspection.id}`} label="Correction items (one a line)" error={itemsError}>
					<textarea
						id={`items-${inspection.id}`}
						className="field-input"
						rows={4}
						value={items}
						onChange={(e) => setItems(e.target.value)}
						placeholder={'Secure the cable within 12 in. of each box\nLabel the panel directory'}
					/>
				</FormField>
			)}
			<FormField id={`result-photos-${inspection.id}`} label="Photos (PNG or JPEG, optional)">
				<input
					id={`result-photos-${inspection.id}`}
					ref={photos}
					type="file"
					multiple
					accept="image/png,image/jpeg"
					className="block text-sm"
				/>
			</FormField>
			{failure && <Notice tone="error">{failure}</Notice>}
			<button type="submit" className="btn-primary" disabled={busy}>
				{busy ? 'Recording…' : 'Record the result'}
			</button>
		</form>
	);
}

function CancelRequest({ inspection, onDone }: { inspection: InspectionRecord; onDone: () => void }) {
	const [asking, setAsking] = useState(false);
	const { busy, error, run } = useAction();
	const cancel = async () => {
		const done = await run(() => api(`/api/inspections/${inspection.id}/cancel`, { method: 'POST' }));
		setAsking(false);
		if (done) onDone();
	};
	return (
		<div className="mt-3">
			<button type="button" className="btn-quiet" onClick={() => setAsking(true)}>
				Cancel the request
			</button>
			{error && <p className="field-error">{error}</p>}
			<ConfirmDialog
				open={asking}
				title={`Cancel the ${INSPECTION_KIND_LABELS[inspection.kind].toLowerCase()} request?`}
				body={
					inspection.scheduledFor
						? `The visit on ${dateText(inspection.scheduledFor)} is called off. You can request the inspection again.`
						: 'The request is withdrawn. You can request the inspection again.'
				}
				confirmLabel="Cancel the request"
				cancelLabel="Keep it"
				busy={busy}
				onConfirm={cancel}
				onCancel={() => setAsking(false)}
			/>
		</div>
	);
}

function InspectionCard({
	inspection: i,
	mode,
	sides,
	onChange,
}: {
	inspection: InspectionRecord;
	mode: Props['mode'];
	sides: Listing['sides'];
	onChange: () => void;
}) {
	const contractor = mode === 'contractor' && sides.contractor;
	const inspector = mode === 'inspector' && sides.inspector;
	const open = i.status === 'requested' || i.status === 'scheduled';
	return (
		<li
			className="rounded-md border border-ink-200 p-4"
			data-testid="inspection"
			data-kind={i.kind}
			data-status={i.status}
		>
			<div className="flex flex-wrap items-center justify-between gap-2">
				<h3 className="font-bold text-ink-950">{INSPECTION_KIND_LABELS[i.kind]}</h3>
				<span className={`rounded px-2 py-0.5 text-sm font-semibold ${STATUS_TONES[i.status] ?? ''}`}>
					{INSPECTION_STATUS_LABELS[i.status]}
				</span>
			</div>
			<dl className="mt-2 grid gap-x-4 gap-y-1 text-sm sm:grid-cols-[10rem_1fr]">
				<dt className="text-ink-500">Requested</dt>
				<dd>
					{new Date(i.requestedAt).toLocaleDateString('en-US', {
						month: 'short',
						day: 'numeric',
						year: 'numeric',
					})}
					{i.requestedByName ? ` by ${i.requestedByName}` : ''}
				</dd>
				<dt className="text-ink-500">Preferred dates</dt>
				<dd>{i.preferredDates.map(dateText).join(' · ')}</dd>
				{i.requestNote && (
					<>
						<dt className="text-ink-500">Note</dt>
						<dd className="whitespace-pre-line">{i.requestNote}</dd>
					</>
				)}
				<dt className="text-ink-500">Scheduled for</dt>
				<dd data-testid="scheduled-for">
					{i.scheduledFor
						? `${dateText(i.scheduledFor)}${i.inspectorName ? ` (${i.inspectorName})` : ''}`
						: 'Not yet scheduled'}
				</dd>
				{i.recordedAt && (
					<>
						<dt className="text-ink-500">Result</dt>
						<dd>
							{i.status === 'passed' ? 'Passed' : 'Failed'} on{' '}
							{new Date(i.recordedAt).toLocaleDateString('en-US', {
								month: 'short',
								day: 'numeric',
								year: 'numeric',
							})}
							{i.recordedByName ? ` by ${i.recordedByName}` : ''}
						</dd>
					</>
				)}
				{i.resultNotes && (
					<>
						<dt className="text-ink-500">Inspector’s notes</dt>
						<dd className="whitespace-pre-line">{i.resultNotes}</dd>
					</>
				)}
			</dl>

			{i.items.length > 0 && (
				<div className="mt-3">
					<h4 className="text-sm font-bold text-ink-900">Correction items</h4>
					<ol className="mt-1 space-y-2">
						{i.items.map((it, n) => (
							<li
								key={it.id}
								className="rounded border border-ink-100 p-2 text-sm"
								data-testid="correction-item"
								data-status={it.status}
							>
								<p>
									<span className="font-semibold">{n + 1}.</span> {it.body}{' '}
									<span className={it.status === 'open' ? 'text-signal-violation' : 'text-signal-ok'}>
										({it.status === 'open' ? 'open' : 'answered'})
									</span>
								</p>
								{it.answer && (
									<p className="mt-1 border-l-2 border-copper-400 pl-2 text-ink-700">
										<span className="font-semibold">{it.answeredByName ?? 'Contractor'}:</span> {it.answer}
									</p>
								)}
								{contractor && i.status === 'failed' && (
									<AnswerBox itemId={it.id} initial={it.answer} onDone={onChange} />
								)}
							</li>
						))}
					</ol>
				</div>
			)}

			{i.photos.length > 0 && (
				<div className="mt-3">
					<h4 className="text-sm font-bold text-ink-900">Photos</h4>
					<ul className="mt-1 flex flex-wrap gap-2">
						{i.photos.map((p) => (
							<li key={p.id}>
								<a href={p.urls.file} target="_blank" rel="noreferrer" className="block">
									<img
										src={p.urls.thumbnail ?? p.urls.file}
										alt={p.caption || p.originalName}
										className="h-24 w-auto rounded border border-ink-200 object-cover"
									/>
								</a>
								{p.caption && <p className="max-w-[10rem] truncate text-xs text-ink-600">{p.caption}</p>}
							</li>
						))}
					</ul>
				</div>
			)}

			{contractor && open && <CancelRequest inspection={i} onDone={onChange} />}

			{inspector && (
				<div className="mt-3 space-y-3">
					{open && <ScheduleForm inspection={i} onDone={onChange} />}
					{i.status === 'scheduled' && <ResultForm inspection={i} onDone={onChange} />}
					{(i.status === 'passed' || i.status === 'failed') && (
						<PhotoUpload inspectionId={i.id} onDone={onChange} />
					)}
				</div>
			)}
		</li>
	);
}

function ClosePermit({ jobId, onDone }: { jobId: string; onDone: () => void }) {
	const { busy, error, run } = useAction();
	const close = async () => {
		if (await run(() => api(`/api/jobs/${jobId}/transitions`, { method: 'POST', body: { action: 'close' } })))
			onDone();
	};
	return (
		<div className="flex flex-wrap items-center gap-3 rounded-md bg-green-50 p-3 text-sm">
			<p className="text-ink-900">
				The final inspection passed. Close the permit when nothing else is outstanding.
			</p>
			<button type="button" className="btn-primary" onClick={close} disabled={busy}>
				{busy ? 'Closing…' : 'Close the permit'}
			</button>
			{error && <p className="field-error w-full">{error}</p>}
		</div>
	);
}

/**
 * The job's rough-in and final inspections: the firm requests them and answers correction items,
 * the inspector of the jurisdiction schedules and records results with photos, readers see the record.
 */
export default function InspectionsSection({ jobId, mode, onStatus }: Props) {
	const listing = useResource(() => api<Listing>(`/api/jobs/${jobId}/inspections`), jobId);
	const l = listing.data;
	const status = l?.jobStatus;
	useEffect(() => {
		if (status) onStatus?.(status);
	}, [status, onStatus]);
	return (
		<LoadState
			loading={listing.loading}
			error={listing.error}
			onRetry={listing.reload}
			what="the inspections"
			hasData={!!l}
		>
			{l && (
				<div className="space-y-4" data-testid="inspections-section">
					<p className="text-sm text-ink-600">
						Permit status:{' '}
						<span className="font-semibold text-ink-900">{JOB_STATUS_LABELS[l.jobStatus]}</span>
					</p>
					{mode === 'inspector' && l.sides.inspector && l.jobStatus === 'final-passed' && (
						<ClosePermit jobId={jobId} onDone={listing.reload} />
					)}
					{mode === 'contractor' && l.sides.contractor && (
						<RequestForm key={l.inspections.length} jobId={jobId} listing={l} onDone={listing.reload} />
					)}
					{l.inspections.length === 0 ? (
						<p className="text-ink-600">No inspection has been requested yet.</p>
					) : (
						<ol className="space-y-3">
							{[...l.inspections].reverse().map((i) => (
								<InspectionCard
									key={`${i.id}:${i.version}`}
									inspection={i}
									mode={mode}
									sides={l.sides}
									onChange={listing.reload}
								/>
							))}
						</ol>
					)}
					{mode !== 'readonly' && (
						<p className="text-xs text-ink-500">
							An inspection record helps the people on the job keep track; it does not replace the inspector’s
							own report or the permit conditions of the jurisdiction.
						</p>
					)}
				</div>
			)}
		</LoadState>
	);
}

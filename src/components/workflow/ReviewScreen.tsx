import { zodResolver } from '@hookform/resolvers/zod';
import { useMemo, useState, type ReactNode } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { api, messageOf } from '../../lib/client/api-client';
import type { CommentView } from '../../lib/repositories/review-comments';
import type { Revision, RevisionSummary } from '../../lib/repositories/revisions';
import {
	reviewCommentSchema,
	reviewDecisionSchema,
	THREAD_OPEN_STATUSES,
} from '../../lib/schemas/review-comment';
import { PERMIT_ISSUED, type JobStatus } from '../../lib/workflow/status';
import LoadCalculation from '../job/LoadCalculation';
import { formErrorMessage } from '../jobs/form-helpers';
import StatusTag from '../jobs/StatusTag';
import Notice from '../ui/Notice';
import CommentThread from './CommentThread';
import InspectionsSection from './InspectionsSection';
import PacketViewer, { type SheetPin } from './PacketViewer';
import RevisionChanges from './RevisionChanges';
import { SubmittedFindings, SubmittedPanels } from './SubmittedJob';

export interface ReviewJob {
	id: string;
	name: string;
	address: string;
	firmName: string;
	status: JobStatus;
	permitNumber: string;
	currentRevision: number;
	assignedInspectorId: string | null;
	assignedInspectorName: string | null;
}

interface Props {
	job: ReviewJob;
	revision: Revision;
	revisions: RevisionSummary[];
	comments: CommentView[];
	userId: string;
}

type Tab = 'comments' | 'panels' | 'findings' | 'load' | 'changes';

/**
 * The plan review screen: the submitted packet on canvas beside the revision as submitted (panels,
 * circuits, findings, load calculation), the comments pinned to it, and the decision.
 */
export default function ReviewScreen({ job: loaded, revision, revisions, comments: initial, userId }: Props) {
	// An inspection result moves the job on this screen: its status comes back with the inspections.
	const [status, setStatus] = useState(loaded.status);
	const job = { ...loaded, status };
	const [comments, setComments] = useState(initial);
	const [tab, setTab] = useState<Tab>('comments');
	const [draft, setDraft] = useState<Draft | null>(null);
	const [pinning, setPinning] = useState(false);
	const [highlight, setHighlight] = useState<string | null>(null);
	const latest = revision.number === job.currentRevision;
	const reviewing = job.status === 'in-review';
	const canComment =
		latest && (job.status === 'in-review' || job.status === 'submitted' || job.status === 'resubmitted');

	const pins: SheetPin[] = useMemo(
		() =>
			comments
				.filter((c) => c.revision === revision.number && c.targetKind === 'sheet' && c.point)
				.map((c) => ({
					id: c.id,
					number: c.number,
					sheet: c.sheet!,
					x: c.point!.x,
					y: c.point!.y,
					status: c.status,
				})),
		[comments, revision.number],
	);
	const changed = (c: CommentView) => setComments((list) => list.map((x) => (x.id === c.id ? c : x)));
	const open = comments.filter((c) => c.status === 'open').length;
	const unresolved = comments.filter((c) => c.status !== 'resolved').length;
	const packetUrl = `/api/jobs/${job.id}/revisions/${revision.number}/packet.pdf`;

	const startComment = (d: Draft) => {
		setDraft(d);
		setTab('comments');
	};

	return (
		<div className="space-y-4">
			<header className="flex flex-wrap items-start justify-between gap-3">
				<div>
					<p className="text-sm text-ink-500">
						<a href="/inspector" className="underline">
							Plan review queue
						</a>{' '}
						/
					</p>
					<h1 className="text-2xl font-bold tracking-tight text-ink-950" data-testid="job-name">
						{job.name}
					</h1>
					<p className="text-ink-600">
						{job.address} · {job.firmName}
					</p>
					<p className="mt-1 flex flex-wrap items-center gap-2 text-sm" data-testid="review-status">
						<StatusTag status={job.status} />
						{job.permitNumber && (
							<span data-testid="permit-number">
								Permit <strong>{job.permitNumber}</strong>
							</span>
						)}
						<span className="text-ink-600">
							Reviewer: {job.assignedInspectorName ?? 'not assigned'}
							{job.assignedInspectorId === userId && ' (you)'}
						</span>
					</p>
				</div>
				<div className="flex flex-wrap items-center gap-2">
					{revisions.length > 1 && (
						<label className="text-sm">
							<span className="mr-1 font-semibold">Revision</span>
							<select
								className="field-input inline-block w-auto py-1"
								value={revision.number}
								onChange={(e) => {
									window.location.search = `?revision=${e.target.value}`;
								}}
								data-testid="revision-picker"
							>
								{[...revisions]
									.sort((a, b) => b.number - a.number)
									.map((r) => (
										<option key={r.number} value={r.number}>
											rev {r.number} · {r.submittedAt.slice(0, 10)}
											{r.number === job.currentRevision ? ' (latest)' : ''}
										</option>
									))}
							</select>
						</label>
					)}
					<AssignButton job={job} userId={userId} />
				</div>
			</header>

			{!latest && (
				<Notice tone="info">
					You are looking at revision {revision.number}. The latest is revision {job.currentRevision}:{' '}
					<a className="underline" href="?">
						open it
					</a>
					.
				</Notice>
			)}

			{PERMIT_ISSUED.includes(job.status) && (
				<section className="panel-card" aria-labelledby="inspections-h">
					<h2 id="inspections-h" className="mb-3 text-lg font-bold text-ink-950">
						Inspections
					</h2>
					<InspectionsSection jobId={job.id} mode="inspector" onStatus={setStatus} />
				</section>
			)}

			<div className="grid gap-4 xl:grid-cols-[minmax(0,1fr)_32rem]">
				<section className="panel-card" aria-label="Submitted packet" data-revision={revision.number}>
					<div className="mb-2 flex flex-wrap items-center justify-between gap-2">
						<h2 className="text-lg font-bold text-ink-950">
							Packet, revision {revision.number}{' '}
							<span className="text-sm font-normal text-ink-600">
								submitted{' '}
								{new Date(revision.submittedAt).toLocaleDateString('en-US', { dateStyle: 'medium' })}
								{revision.submittedBy ? ` by ${revision.submittedBy.name}` : ''} · {revision.packetPages}{' '}
								sheets
							</span>
						</h2>
						{canComment && (
							<button
								type="button"
								className={pinning ? 'btn-primary px-3 py-1' : 'btn-quiet px-3 py-1'}
								aria-pressed={pinning}
								onClick={() => setPinning((p) => !p)}
								data-testid="pin-mode"
							>
								{pinning ? 'Click on the sheet…' : 'Pin a comment to the sheet'}
							</button>
						)}
					</div>
					<PacketViewer
						url={packetUrl}
						pins={pins}
						draft={draft?.kind === 'sheet' ? { sheet: draft.sheet, x: draft.x ?? 0, y: draft.y ?? 0 } : null}
						onPick={
							pinning
								? (sheet, x, y) => {
										startComment({ kind: 'sheet', sheet, x, y });
										setPinning(false);
									}
								: undefined
						}
						onPinClick={(id) => {
							setHighlight(id);
							setTab('comments');
						}}
					/>
				</section>

				<aside className="panel-card" aria-label="Review">
					<div role="tablist" aria-label="What was submitted" className="mb-3 flex flex-wrap gap-1 text-sm">
						<TabButton id="comments" tab={tab} setTab={setTab}>
							Comments ({unresolved} unresolved)
						</TabButton>
						<TabButton id="panels" tab={tab} setTab={setTab}>
							Panels &amp; circuits
						</TabButton>
						<TabButton id="findings" tab={tab} setTab={setTab}>
							Findings
						</TabButton>
						<TabButton id="load" tab={tab} setTab={setTab}>
							Load calculation
						</TabButton>
						{revision.number > 1 && (
							<TabButton id="changes" tab={tab} setTab={setTab}>
								Changes since rev {revision.number - 1}
							</TabButton>
						)}
					</div>

					{tab === 'comments' && (
						<div className="space-y-3">
							{revision.note && (
								<div className="rounded-md bg-ink-50 p-3 text-sm" data-testid="submission-note">
									<p className="font-semibold">Submission note</p>
									<p className="whitespace-pre-line">{revision.note}</p>
								</div>
							)}
							{canComment && (
								<NewComment
									jobId={job.id}
									revision={revision}
									draft={draft}
									setDraft={setDraft}
									onCreated={(c) => {
										setComments((list) => [...list, c]);
										setDraft(null);
										setHighlight(c.id);
									}}
								/>
							)}
							{comments.length === 0 ? (
								<p className="text-ink-600">No comments yet.</p>
							) : (
								<div className="space-y-2">
									{comments.map((c) => (
										<CommentThread
											key={c.id}
											comment={c}
											side={THREAD_OPEN_STATUSES.includes(job.status) ? 'inspector' : 'reader'}
											onChanged={changed}
											highlighted={highlight === c.id}
										/>
									))}
								</div>
							)}
							{reviewing && latest && <Decision jobId={job.id} open={open} unresolved={unresolved} />}
						</div>
					)}
					{tab === 'panels' && (
						<SubmittedPanels
							document={revision.document}
							results={revision.results}
							onComment={canComment ? (t) => startComment({ kind: t.kind, id: t.id }) : undefined}
						/>
					)}
					{tab === 'findings' && (
						<div className="space-y-3">
							{revision.explanations.length > 0 && (
								<p className="text-sm text-ink-600">
									The contractor explained {revision.explanations.length} error-level finding
									{revision.explanations.length === 1 ? '' : 's'} left in the submission.
								</p>
							)}
							<SubmittedFindings results={revision.results} explanations={revision.explanations} />
						</div>
					)}
					{tab === 'load' && <LoadCalculation service={revision.results.service} />}
					{tab === 'changes' && <RevisionChanges jobId={job.id} revision={revision.number} />}
				</aside>
			</div>
		</div>
	);
}

function TabButton({
	id,
	tab,
	setTab,
	children,
}: {
	id: Tab;
	tab: Tab;
	setTab: (t: Tab) => void;
	children: ReactNode;
}) {
	return (
		<button
			type="button"
			role="tab"
			aria-selected={tab === id}
			onClick={() => setTab(id)}
			className={`rounded-md border px-3 py-1 font-semibold ${tab === id ? 'border-copper-500 bg-copper-50 text-copper-800' : 'border-ink-200 bg-white text-ink-700 hover:border-copper-400'}`}
		>
			{children}
		</button>
	);
}

function AssignButton({ job, userId }: { job: ReviewJob; userId: string }) {
	const [busy, setBusy] = useState(false);
	const [error, setError] = useState<string | null>(null);
	const waiting = job.status === 'submitted' || job.status === 'resubmitted';
	if (!waiting && !(job.status === 'in-review' && job.assignedInspectorId !== userId)) return null;
	return (
		<div>
			<button
				type="button"
				className="btn-primary"
				disabled={busy}
				onClick={async () => {
					setBusy(true);
					setError(null);
					try {
						await api(`/api/jobs/${job.id}/assign`, { method: 'POST' });
						window.location.reload();
					} catch (err) {
						setError(messageOf(err));
						setBusy(false);
					}
				}}
			>
				{waiting
					? job.assignedInspectorId === userId
						? 'Start review'
						: 'Assign to me and start review'
					: 'Assign to me'}
			</button>
			{error && <p className="field-error">{error}</p>}
		</div>
	);
}

type Draft =
	| { kind: 'sheet'; sheet: number; x?: number; y?: number }
	| { kind: 'panel' | 'circuit'; id: string }
	| { kind: 'job' };

type CommentInput = z.input<typeof reviewCommentSchema>;
type CommentValues = z.output<typeof reviewCommentSchema>;

function NewComment({
	jobId,
	revision,
	draft,
	setDraft,
	onCreated,
}: {
	jobId: string;
	revision: Revision;
	draft: Draft | null;
	setDraft: (d: Draft | null) => void;
	onCreated: (c: CommentView) => void;
}) {
	const [message, setMessage] = useState<string | null>(null);
	const form = useForm<CommentInput, unknown, CommentValues>({
		resolver: zodResolver(reviewCommentSchema),
		defaultValues: { targetKind: 'job', body: '' },
	});
	const {
		register,
		handleSubmit,
		setError,
		reset,
		formState: { errors, isSubmitting },
	} = form;
	const d: Draft = draft ?? { kind: 'job' };
	const panels = revision.document.panels;
	const circuits = revision.document.circuits;
	const targetValue = d.kind === 'sheet' ? 'sheet' : d.kind === 'job' ? 'job' : `${d.kind}:${d.id}`;

	const submit = handleSubmit(async (values) => {
		setMessage(null);
		try {
			const res = await api<{ comment: CommentView }>(`/api/jobs/${jobId}/comments`, {
				method: 'POST',
				body: values,
			});
			reset({ targetKind: 'job', body: '' });
			onCreated(res.comment);
		} catch (err) {
			setMessage(
				formErrorMessage(err, setError, ['body', 'targetKind', 'sheet', 'point', 'panelId', 'circuitId']),
			);
		}
	});

	// The target comes from the viewer (a click) or the lists; the form carries it to the schema.
	const withTarget = (e: React.FormEvent) => {
		form.setValue('revision', revision.number);
		form.setValue('targetKind', d.kind);
		form.setValue('sheet', d.kind === 'sheet' ? d.sheet : undefined);
		form.setValue('point', d.kind === 'sheet' && d.x !== undefined ? { x: d.x, y: d.y! } : undefined);
		form.setValue('panelId', d.kind === 'panel' ? d.id : undefined);
		form.setValue('circuitId', d.kind === 'circuit' ? d.id : undefined);
		return submit(e);
	};
	const fieldError = errors.sheet ?? errors.point ?? errors.panelId ?? errors.circuitId ?? errors.targetKind;

	return (
		<form
			onSubmit={withTarget}
			noValidate
			className="rounded-md border border-copper-200 bg-copper-50/40 p-3"
			data-testid="new-comment"
		>
			<h3 className="font-bold text-ink-950">New comment</h3>
			<label className="field-label mt-2" htmlFor="comment-target">
				About
			</label>
			<select
				id="comment-target"
				className="field-input"
				value={targetValue}
				onChange={(e) => {
					const v = e.target.value;
					if (v === 'job') setDraft({ kind: 'job' });
					else if (v === 'sheet') setDraft({ kind: 'sheet', sheet: 1 });
					else {
						const [kind, id] = v.split(':') as ['panel' | 'circuit', string];
						setDraft({ kind, id });
					}
				}}
			>
				<option value="job">The whole job</option>
				<option value="sheet">
					{d.kind === 'sheet'
						? `Sheet ${d.sheet}${d.x !== undefined ? ` at ${Math.round(d.x * 100)} % across, ${Math.round(d.y! * 100)} % down` : ''}`
						: 'A sheet (click on the page to pin it)'}
				</option>
				{panels.map((p) => (
					<option key={p.id} value={`panel:${p.id}`}>
						Panel {p.name}
					</option>
				))}
				{circuits.map((c) => (
					<option key={c.id} value={`circuit:${c.id}`}>
						Circuit {c.position}: {c.label} ({panels.find((p) => p.id === c.panelId)?.name ?? 'panel'})
					</option>
				))}
			</select>
			{d.kind === 'sheet' && d.x === undefined && (
				<label className="mt-2 block text-sm">
					Sheet{' '}
					<input
						type="number"
						min={1}
						max={revision.packetPages}
						value={d.sheet}
						onChange={(e) => setDraft({ kind: 'sheet', sheet: Number(e.target.value) })}
						className="field-input inline-block w-24 py-1"
					/>
				</label>
			)}
			{fieldError && <p className="field-error">{fieldError.message}</p>}
			<label className="field-label mt-2" htmlFor="comment-body">
				Comment
			</label>
			<textarea
				id="comment-body"
				rows={3}
				className="field-input"
				aria-invalid={errors.body ? true : undefined}
				aria-describedby={errors.body ? 'comment-body-err' : undefined}
				placeholder="What must change, and the code section it rests on"
				{...register('body')}
			/>
			{errors.body && (
				<p id="comment-body-err" className="field-error">
					{errors.body.message}
				</p>
			)}
			<div className="mt-2 flex gap-2">
				<button type="submit" className="btn-primary" disabled={isSubmitting}>
					Add comment
				</button>
				{draft && (
					<button type="button" className="btn-quiet" onClick={() => setDraft(null)}>
						Clear the target
					</button>
				)}
			</div>
			{message && (
				<div className="mt-2">
					<Notice tone="error">{message}</Notice>
				</div>
			)}
		</form>
	);
}

type DecisionInput = z.input<typeof reviewDecisionSchema>;
type DecisionValues = z.output<typeof reviewDecisionSchema>;

function Decision({ jobId, open, unresolved }: { jobId: string; open: number; unresolved: number }) {
	const [message, setMessage] = useState<string | null>(null);
	const form = useForm<DecisionInput, unknown, DecisionValues>({
		resolver: zodResolver(reviewDecisionSchema),
		defaultValues: { decision: 'request-corrections', note: '' },
	});
	const {
		register,
		handleSubmit,
		setError,
		setValue,
		formState: { errors, isSubmitting },
	} = form;
	const send = handleSubmit(async (values) => {
		setMessage(null);
		try {
			await api(`/api/jobs/${jobId}/decision`, { method: 'POST', body: values });
			window.location.reload();
		} catch (err) {
			setMessage(formErrorMessage(err, setError, ['note', 'decision']));
		}
	});
	return (
		<form
			className="mt-4 rounded-md border border-ink-300 p-3"
			onSubmit={(e) => e.preventDefault()}
			noValidate
			data-testid="decision"
		>
			<h3 className="font-bold text-ink-950">Decision on this revision</h3>
			<p className="text-sm text-ink-600">
				{open} open, {unresolved} unresolved. Requesting corrections sends the open comments to the
				contractor; approving needs every comment resolved and issues the permit number.
			</p>
			<input type="hidden" {...register('decision')} />
			<label className="field-label mt-2" htmlFor="decision-note">
				Note to the contractor (optional)
			</label>
			<textarea id="decision-note" rows={2} className="field-input" {...register('note')} />
			{errors.note && <p className="field-error">{errors.note.message}</p>}
			<div className="mt-2 flex flex-wrap gap-2">
				<button
					type="button"
					className="btn-quiet"
					disabled={isSubmitting || open === 0}
					onClick={() => {
						setValue('decision', 'request-corrections');
						void send();
					}}
				>
					Request corrections
				</button>
				<button
					type="button"
					className="btn-primary"
					disabled={isSubmitting || unresolved > 0}
					onClick={() => {
						setValue('decision', 'approve');
						void send();
					}}
				>
					Approve and issue permit
				</button>
			</div>
			{message && (
				<div className="mt-2">
					<Notice tone="error">{message}</Notice>
				</div>
			)}
		</form>
	);
}

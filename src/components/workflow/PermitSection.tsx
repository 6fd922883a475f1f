import { useMemo, useState } from 'react';
import { api, ApiError, messageOf } from '../../lib/client/api-client';
import type { JobTree } from '../../lib/client/job-tree';
import { useResource } from '../../lib/client/use-resource';
import type { RevisionSummary } from '../../lib/repositories/revisions';
import { EXPLANATION_MAX, SUBMISSION_NOTE_MAX, submissionSchema } from '../../lib/schemas/submission';
import type { Readiness, ReadinessItem } from '../../lib/workflow/readiness';
import type { WorkflowState } from '../../lib/workflow/simple-moves';
import StatusTag from '../jobs/StatusTag';
import ConfirmDialog from '../ui/ConfirmDialog';
import Notice from '../ui/Notice';

interface Props {
	jobId: string;
	/** The live job; the readiness check runs again when its records change. */
	tree: JobTree;
	/** After a move: the job page reloads the job (its status shows in the details). */
	onMoved: () => void;
}

const when = (iso: string) =>
	new Date(iso).toLocaleString('en-US', { dateStyle: 'medium', timeStyle: 'short' });

/** A key that changes whenever a record of the job changes, so the check follows the edits. */
function changeKey(tree: JobTree): string {
	const v = (rows: { id: string; version: number }[]) => rows.map((r) => `${r.id}:${r.version}`).join(',');
	return [tree.job.version, v(tree.rooms), v(tree.panels), v(tree.circuits), v(tree.loads)].join('|');
}

function ItemLine({ item }: { item: ReadinessItem }) {
	return (
		<li className="flex gap-2" data-testid={`readiness-${item.code}`} data-ok={item.ok}>
			<span aria-hidden="true" className={item.ok ? 'text-signal-ok' : 'text-signal-violation'}>
				{item.ok ? '✓' : '✗'}
			</span>
			<span className="sr-only">{item.ok ? 'Met:' : 'Not met:'}</span>
			<span className={item.ok ? 'text-ink-800' : 'text-ink-950'}>{item.message}</span>
		</li>
	);
}

/**
 * The job's place in the permit workflow for its contractor: status, permit number, the readiness
 * check with a note box for each error-level finding, Submit / Resubmit / Withdraw, and the
 * submitted revisions with their stored packets.
 */
export default function PermitSection({ jobId, tree, onMoved }: Props) {
	const key = changeKey(tree);
	const workflow = useResource(() => api<WorkflowState>(`/api/jobs/${jobId}/workflow`), `${jobId}|${key}`);
	const revisions = useResource(
		() => api<{ revisions: RevisionSummary[] }>(`/api/jobs/${jobId}/revisions`).then((r) => r.revisions),
		`${jobId}|${workflow.data?.currentRevision ?? 0}`,
	);
	const readiness = useResource(() => api<Readiness>(`/api/jobs/${jobId}/readiness`), `${jobId}|${key}`);
	const [notes, setNotes] = useState<Record<string, string>>({});
	const [note, setNote] = useState('');
	const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
	const [message, setMessage] = useState<{ tone: 'error' | 'ok'; text: string } | null>(null);
	const [busy, setBusy] = useState(false);
	const [confirmWithdraw, setConfirmWithdraw] = useState(false);

	const w = workflow.data;
	const r = readiness.data;
	const violations = useMemo(() => (r?.items ?? []).filter((i) => i.code === 'violation'), [r]);
	const others = (r?.items ?? []).filter((i) => i.code !== 'violation');
	const canWithdraw = w?.moves.some((m) => m.action === 'withdraw') ?? false;
	const submitLabel = r?.action === 'resubmit' ? 'Resubmit for review' : 'Submit for review';

	const reloadAll = async () => {
		await Promise.all([workflow.reload(), revisions.reload(), readiness.reload()]);
		onMoved();
	};

	const submit = async () => {
		setMessage(null);
		const body = {
			explanations: violations.map((v) => ({ findingKey: v.findingKey!, note: notes[v.findingKey!] ?? '' })),
			note,
		};
		// The same schema as the endpoint: a note left empty is named here, before anything is sent.
		const parsed = submissionSchema.safeParse(body);
		if (!parsed.success) {
			const errs: Record<string, string> = {};
			for (const issue of parsed.error.issues) {
				const [head, index] = issue.path;
				const k =
					head === 'explanations' && typeof index === 'number' ? violations[index]?.findingKey : 'note';
				if (k && !errs[k]) errs[k] = issue.message;
			}
			setFieldErrors(errs);
			setMessage({ tone: 'error', text: 'Some notes need attention before submitting. Nothing was sent.' });
			return;
		}
		setFieldErrors({});
		setBusy(true);
		try {
			const res = await api<{ revision: RevisionSummary }>(`/api/jobs/${jobId}/submissions`, {
				method: 'POST',
				body: parsed.data,
			});
			setNotes({});
			setNote('');
			setMessage({
				tone: 'ok',
				text: `Submitted as revision ${res.revision.number} (${res.revision.packetPages} sheets). The plan reviewer receives this packet as it is now.`,
			});
			await reloadAll();
		} catch (err) {
			if (err instanceof ApiError) {
				const errs: Record<string, string> = {};
				for (const [k, msgs] of Object.entries(err.fields)) {
					if (k.startsWith('explanations.')) errs[k.slice('explanations.'.length)] = msgs[0] ?? '';
					else if (k === 'note') errs.note = msgs[0] ?? '';
				}
				setFieldErrors(errs);
				if (err.status === 409) void readiness.reload();
			}
			setMessage({ tone: 'error', text: messageOf(err) });
		} finally {
			setBusy(false);
		}
	};

	const withdraw = async () => {
		setBusy(true);
		setMessage(null);
		try {
			await api(`/api/jobs/${jobId}/transitions`, { method: 'POST', body: { action: 'withdraw' } });
			setConfirmWithdraw(false);
			setMessage({ tone: 'ok', text: 'The submission is withdrawn. Submit again when the job is ready.' });
			await reloadAll();
		} catch (err) {
			setConfirmWithdraw(false);
			setMessage({ tone: 'error', text: messageOf(err) });
		} finally {
			setBusy(false);
		}
	};

	if (workflow.error && !w) {
		return (
			<Notice tone="error">
				{workflow.error}{' '}
				<button type="button" className="underline" onClick={() => void workflow.reload()}>
					Retry
				</button>
			</Notice>
		);
	}
	if (!w) return <p className="text-sm text-ink-500">Loading the permit status…</p>;

	const missingNotes = violations.filter((v) => !(notes[v.findingKey!] ?? '').trim()).length;
	return (
		<div className="space-y-4" data-testid="permit-section">
			<dl className="grid gap-x-6 gap-y-2 sm:grid-cols-3">
				<div>
					<dt className="text-xs font-semibold uppercase tracking-wide text-ink-500">Status</dt>
					<dd>
						<StatusTag status={w.status} />
					</dd>
				</div>
				<div>
					<dt className="text-xs font-semibold uppercase tracking-wide text-ink-500">Permit number</dt>
					<dd className="text-ink-900" data-testid="permit-number">
						{w.permitNumber || 'Issued by the AHJ on approval'}
					</dd>
				</div>
				<div>
					<dt className="text-xs font-semibold uppercase tracking-wide text-ink-500">Latest revision</dt>
					<dd className="text-ink-900">
						{w.currentRevision
							? `rev ${w.currentRevision}${w.submittedAt ? `, submitted ${when(w.submittedAt)}` : ''}`
							: 'Not submitted yet'}
					</dd>
				</div>
			</dl>

			{message && <Notice tone={message.tone}>{message.text}</Notice>}

			{r?.action && (
				<div className="rounded-md border border-ink-200 p-3" data-testid="readiness">
					<div className="flex flex-wrap items-center justify-between gap-2">
						<h3 className="font-semibold text-ink-950">
							Readiness check before {r.action === 'resubmit' ? 'resubmitting' : 'submitting'}
						</h3>
						<button
							type="button"
							className="btn-quiet"
							onClick={() => void readiness.reload()}
							disabled={readiness.loading}
						>
							{readiness.loading ? 'Checking…' : 'Check again'}
						</button>
					</div>
					{readiness.error && <Notice tone="error">{readiness.error}</Notice>}
					<ul className="mt-2 space-y-1 text-sm">
						{others.map((i, k) => (
							<ItemLine key={`${i.code}-${k}`} item={i} />
						))}
					</ul>
					{violations.length > 0 && (
						<div className="mt-3">
							<p className="text-sm font-semibold text-signal-violation">
								{violations.length} error-level finding{violations.length === 1 ? '' : 's'}: fix{' '}
								{violations.length === 1 ? 'it' : 'each'} in the job, or explain why it stays. Your note is
								printed in the packet for the plan reviewer.
							</p>
							<ol className="mt-2 space-y-3">
								{violations.map((v) => {
									const id = `explain-${v.findingKey}`;
									const err = fieldErrors[v.findingKey!];
									return (
										<li key={v.findingKey} className="text-sm">
											<label htmlFor={id} className="block text-ink-950">
												{v.message} <span className="text-ink-500">[{v.rule}]</span>
											</label>
											<textarea
												id={id}
												rows={2}
												maxLength={EXPLANATION_MAX}
												className="field-input mt-1"
												aria-invalid={err ? true : undefined}
												aria-describedby={err ? `${id}-error` : undefined}
												placeholder="Why this stays as it is (e.g. the AHJ’s approved alternative, an existing condition outside the scope)"
												value={notes[v.findingKey!] ?? ''}
												onChange={(e) => setNotes((n) => ({ ...n, [v.findingKey!]: e.target.value }))}
											/>
											{err && (
												<p id={`${id}-error`} role="alert" className="field-error">
													{err}
												</p>
											)}
										</li>
									);
								})}
							</ol>
						</div>
					)}
					<div className="mt-3">
						<label htmlFor="submission-note" className="field-label">
							Note to the plan reviewer (optional)
						</label>
						<textarea
							id="submission-note"
							rows={2}
							maxLength={SUBMISSION_NOTE_MAX}
							className="field-input"
							value={note}
							onChange={(e) => setNote(e.target.value)}
						/>
						{fieldErrors.note && (
							<p role="alert" className="field-error">
								{fieldErrors.note}
							</p>
						)}
					</div>
					<p className="mt-2 text-xs text-ink-500">
						The check helps complete the packet; it does not approve the design. The AHJ’s plan review and
						inspections decide.
					</p>
					<div className="mt-3 flex flex-wrap items-center gap-3">
						<button
							type="button"
							className="btn-primary"
							disabled={busy || !r.canSubmit || readiness.loading}
							onClick={() => void submit()}
						>
							{busy ? 'Preparing the packet…' : submitLabel}
						</button>
						{!r.canSubmit && (
							<span className="text-sm text-ink-600">Complete the items marked ✗ above first.</span>
						)}
						{r.canSubmit && missingNotes > 0 && (
							<span className="text-sm text-ink-600">
								{missingNotes} finding{missingNotes === 1 ? '' : 's'} still without a note.
							</span>
						)}
					</div>
				</div>
			)}

			{canWithdraw && (
				<div>
					<button
						type="button"
						className="btn-quiet text-signal-violation"
						onClick={() => setConfirmWithdraw(true)}
					>
						Withdraw the submission…
					</button>
				</div>
			)}
			<ConfirmDialog
				open={confirmWithdraw}
				title="Withdraw the submission?"
				body="The plan reviewer stops reviewing it. The submitted revisions stay on record; you can submit again later as a new revision."
				confirmLabel="Withdraw"
				busy={busy}
				onConfirm={() => void withdraw()}
				onCancel={() => setConfirmWithdraw(false)}
			/>

			<div>
				<h3 className="font-semibold text-ink-950">Submitted revisions</h3>
				{revisions.error && <Notice tone="error">{revisions.error}</Notice>}
				{revisions.data && revisions.data.length === 0 && (
					<p className="text-sm text-ink-500">
						None yet. Each submission is kept here exactly as it was sent.
					</p>
				)}
				{revisions.data && revisions.data.length > 0 && (
					<ul className="mt-1 divide-y divide-ink-100 text-sm" data-testid="revisions-list">
						{[...revisions.data].reverse().map((rev) => (
							<li key={rev.number} className="flex flex-wrap items-center justify-between gap-2 py-2">
								<span>
									<span className="font-semibold">rev {rev.number}</span> · {when(rev.submittedAt)}
									{rev.submittedBy ? ` · ${rev.submittedBy.name}` : ''} · {rev.packetPages} sheets
									<span className="block font-mono text-xs text-ink-500" title="sha256 of the stored packet">
										packet sha256 {rev.packetSha256.slice(0, 16)}…
									</span>
								</span>
								<a
									className="btn-quiet"
									href={`/api/jobs/${jobId}/revisions/${rev.number}/packet.pdf?download=1`}
								>
									Download the rev {rev.number} packet
								</a>
							</li>
						))}
					</ul>
				)}
			</div>
		</div>
	);
}

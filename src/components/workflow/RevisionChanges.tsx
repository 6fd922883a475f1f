import { useState } from 'react';
import { api } from '../../lib/client/api-client';
import { useResource } from '../../lib/client/use-resource';
import type {
	FigureChange,
	RecordChange,
	RevisionChanges as Changes,
} from '../../lib/workflow/revision-diff';
import LoadState from '../ui/LoadState';
import Notice from '../ui/Notice';
import { changeSentence, fieldLabel, numberText, recordSummary, valueText } from './change-words';

interface Props {
	jobId: string;
	/** The revision to show the changes of (against the one before it). */
	revision: number;
}

const CHANGE_WORDS = { added: 'added', removed: 'removed', changed: 'changed' } as const;
const CHANGE_TONES = {
	added: 'bg-green-50 text-signal-ok',
	removed: 'bg-red-50 text-signal-violation',
	changed: 'bg-amber-50 text-ink-900',
} as const;

function figureText(f: FigureChange, value: number | null): string {
	if (value === null) return '—';
	return f.unit === 'count' ? numberText(value) : `${numberText(value)} ${f.unit}`;
}

function delta(f: FigureChange): string {
	if (f.before === null || f.after === null || !f.changed) return '';
	const d = f.after - f.before;
	const sign = d > 0 ? '+' : '−';
	return `${sign}${f.unit === 'count' ? numberText(Math.abs(d)) : `${numberText(Math.abs(d))} ${f.unit}`}`;
}

function RecordCard({ r, data }: { r: RecordChange; data: Changes }) {
	const answered = data.comments.filter((c) => r.answers.includes(c.id));
	const rec = r.before ?? r.after;
	return (
		<li className="rounded-md border border-ink-200 p-3 text-sm" data-testid="change" data-key={r.key}>
			<p className="font-semibold text-ink-950">
				<span className={`mr-2 rounded px-1.5 py-0.5 text-xs font-semibold ${CHANGE_TONES[r.change]}`}>
					{CHANGE_WORDS[r.change]}
				</span>
				{r.title}
				{r.titleBefore && <span className="font-normal text-ink-500"> (was {r.titleBefore})</span>}
			</p>
			<div className="mt-2 grid grid-cols-[minmax(5rem,auto)_1fr_1fr] gap-x-3 gap-y-1">
				<span>
					<span className="sr-only">Field</span>
				</span>
				<span className="text-xs font-semibold uppercase tracking-wide text-ink-500">
					Revision {data.from}
				</span>
				<span className="text-xs font-semibold uppercase tracking-wide text-ink-500">Revision {data.to}</span>
				{r.change === 'changed' ? (
					r.fields.map((f) => (
						<div
							key={f.field}
							className="contents"
							data-testid="change-row"
							title={changeSentence(r, f, data.names)}
						>
							<span className="text-ink-600">{fieldLabel(f.field)}</span>
							<del className="text-ink-600 decoration-ink-400">
								{valueText(f.field, f.before, data.names)}
							</del>
							<ins className="font-semibold text-ink-950 no-underline">
								<span aria-hidden="true">→ </span>
								{valueText(f.field, f.after, data.names)}
							</ins>
						</div>
					))
				) : (
					<div className="contents" data-testid="change-row">
						<span className="text-ink-600">{r.change === 'added' ? 'added' : 'removed'}</span>
						<span className={r.change === 'removed' ? 'text-ink-700' : 'text-ink-400'}>
							{r.change === 'removed' && rec ? recordSummary(r.kind, rec, data.names) : 'not there'}
						</span>
						<span className={r.change === 'added' ? 'font-semibold text-ink-950' : 'text-ink-400'}>
							{r.change === 'added' && rec ? recordSummary(r.kind, rec, data.names) : 'removed'}
						</span>
					</div>
				)}
			</div>
			{answered.length > 0 && (
				<div className="mt-2 border-t border-ink-100 pt-2">
					<p className="text-xs font-semibold text-ink-600">
						Answers the review comment{answered.length === 1 ? '' : 's'}:
					</p>
					<ul className="mt-1 space-y-1">
						{answered.map((c) => (
							<li key={c.id} className="text-xs text-ink-700">
								“{c.body.length > 120 ? `${c.body.slice(0, 119)}…` : c.body}”
							</li>
						))}
					</ul>
				</div>
			)}
		</li>
	);
}

/**
 * What changed in a revision since the one before it, side by side (before | after): panels,
 * circuits, loads, rooms and job settings, the calculation figures, and the review comments each
 * change answers.
 */
export default function RevisionChanges({ jobId, revision }: Props) {
	const changes = useResource(
		() => api<Changes>(`/api/jobs/${jobId}/revisions/${revision}/changes`),
		`${jobId}:${revision}`,
	);
	const data = changes.data;
	const [all, setAll] = useState(false);
	const changed = data?.figures.filter((f) => f.changed) ?? [];
	const shown = data && (all || data.from === null) ? data.figures : changed;
	return (
		<LoadState
			loading={changes.loading}
			error={changes.error}
			onRetry={changes.reload}
			what="the changes"
			hasData={!!data}
		>
			{data && (
				<div className="space-y-5" data-testid="revision-changes">
					{data.from === null ? (
						<Notice tone="info">
							Revision {data.to} is the first submission: there is nothing to compare it with.
						</Notice>
					) : (
						<>
							<p className="text-sm text-ink-600">
								Revision {data.to} compared with revision {data.from}:{' '}
								{data.records.length === 0
									? 'no panel, circuit, load, room or job setting changed.'
									: `${data.records.length} record${data.records.length === 1 ? '' : 's'} added, removed or changed.`}
							</p>
							{data.records.length > 0 && (
								<ul className="space-y-2">
									{data.records.map((r) => (
										<RecordCard key={r.key} r={r} data={data} />
									))}
								</ul>
							)}
						</>
					)}

					<div>
						<div className="mb-1 flex flex-wrap items-baseline justify-between gap-2">
							<h3 className="font-bold text-ink-900">Calculation figures</h3>
							{data.from !== null && (
								<button type="button" className="text-sm underline" onClick={() => setAll(!all)}>
									{all ? 'Show only the changed figures' : `Show all ${data.figures.length} figures`}
								</button>
							)}
						</div>
						{data.from !== null && changed.length === 0 && !all && (
							<p className="text-sm text-ink-600">No calculation figure changed.</p>
						)}
						{shown.length > 0 && (
							<div className="overflow-x-auto">
								<table className="w-full text-sm" data-testid="figure-changes">
									<thead>
										<tr className="text-left text-xs uppercase tracking-wide text-ink-500">
											<th scope="col" className="pb-1 pr-3">
												Figure
											</th>
											<th scope="col" className="pb-1 pr-3 text-right">
												{data.from === null ? '' : `Revision ${data.from}`}
											</th>
											<th scope="col" className="pb-1 pr-3 text-right">
												Revision {data.to}
											</th>
											<th scope="col" className="pb-1 text-right">
												Change
											</th>
										</tr>
									</thead>
									<tbody>
										{shown.map((f) => (
											<tr
												key={f.key}
												className={`border-t border-ink-100 ${f.changed && data.from !== null ? 'bg-amber-50' : ''}`}
											>
												<th scope="row" className="py-1 pr-3 text-left font-normal text-ink-800">
													{f.label}
												</th>
												<td className="py-1 pr-3 text-right tabular-nums text-ink-600">
													{figureText(f, f.before)}
												</td>
												<td className="py-1 pr-3 text-right font-semibold tabular-nums text-ink-950">
													{figureText(f, f.after)}
												</td>
												<td className="py-1 text-right tabular-nums text-ink-700">{delta(f)}</td>
											</tr>
										))}
									</tbody>
								</table>
							</div>
						)}
					</div>

					{data.comments.length > 0 && (
						<div>
							<h3 className="mb-1 font-bold text-ink-900">
								Review comments of revision {data.from} and the changes
							</h3>
							<ul className="space-y-2" data-testid="comment-answers">
								{data.comments.map((c) => (
									<li key={c.id} className="rounded-md border border-ink-200 p-3 text-sm">
										<p className="text-xs font-semibold uppercase tracking-wide text-ink-500">
											{c.targetKind === 'sheet'
												? `Sheet ${c.sheet}`
												: c.targetKind === 'job'
													? 'Whole job'
													: c.targetLabel ||
														(c.circuitId
															? data.names[c.circuitId]
															: c.panelId
																? data.names[c.panelId]
																: '')}{' '}
											· {c.status}
										</p>
										<p className="mt-1 text-ink-900">{c.body}</p>
										{c.answers.map((a, i) => (
											<p key={i} className="mt-1 border-l-2 border-copper-400 pl-2 text-ink-700">
												<span className="font-semibold">{a.authorName ?? 'Contractor'}:</span> {a.body}
											</p>
										))}
										<p className="mt-1 text-xs text-ink-600">
											{c.answeredBy.length
												? `Changed since: ${c.answeredBy
														.map((k) => data.records.find((r) => r.key === k)?.title ?? k)
														.join(', ')}`
												: c.targetKind === 'sheet' || c.targetKind === 'job'
													? 'Not pinned to a panel or circuit: check the packet.'
													: 'Nothing on its panel or circuit changed.'}
										</p>
									</li>
								))}
							</ul>
						</div>
					)}
				</div>
			)}
		</LoadState>
	);
}

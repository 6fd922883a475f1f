import { api } from '../../lib/client/api-client';
import { useResource } from '../../lib/client/use-resource';
import type { AuditEntry } from '../../lib/repositories/audit';
import type { TimelineEntry } from '../../lib/repositories/workflow-history';
import type { WorkflowState } from '../../lib/workflow/simple-moves';
import { JOB_STATUS_LABELS, TRANSITIONS, type JobStatus } from '../../lib/workflow/status';
import Notice from '../ui/Notice';

/** A run of record edits between two workflow moves, summarised on one line. */
export interface EditsSummary {
	kind: 'edits';
	id: string;
	at: string;
	count: number;
	byEntity: Record<string, number>;
	people: string[];
}

export type TimelineItem = (TimelineEntry & { kind?: 'workflow' }) | EditsSummary;

const when = (iso: string) =>
	new Date(iso).toLocaleString('en-US', { dateStyle: 'medium', timeStyle: 'short' });

const ENTITY_WORDS: Record<string, [string, string]> = {
	job: ['job detail', 'job details'],
	room: ['room', 'rooms'],
	panel: ['panelboard', 'panelboards'],
	circuit: ['circuit', 'circuits'],
	load: ['load', 'loads'],
	sketch: ['sketch', 'sketches'],
};

const obj = (v: unknown) => (v && typeof v === 'object' ? (v as Record<string, unknown>) : {});

/** One workflow entry in words: "Submitted for plan review (rev 1)", "Comment answered", … */
export function describeEntry(e: TimelineEntry): { title: string; detail?: string } {
	const after = obj(e.after);
	const before = obj(e.before);
	if (e.entity === 'status') {
		const action = TRANSITIONS.find((t) => t.action === after.action);
		const to = JOB_STATUS_LABELS[after.status as JobStatus] ?? String(after.status ?? '');
		const from = JOB_STATUS_LABELS[before.status as JobStatus];
		return {
			title: action ? `${action.label}: now “${to}”` : `Status: ${to}`,
			detail: [from ? `was “${from}”` : '', typeof after.note === 'string' ? after.note : '']
				.filter(Boolean)
				.join(' · '),
		};
	}
	if (e.entity === 'revision') {
		const pages = typeof after.packetPages === 'number' ? `, ${after.packetPages} sheets` : '';
		const explained =
			typeof after.explained === 'number' && after.explained > 0
				? `, ${after.explained} finding${after.explained === 1 ? '' : 's'} explained`
				: '';
		return { title: `Revision ${String(after.number ?? '')} stored${pages}${explained}` };
	}
	if (e.entity === 'comment') {
		const words: Record<string, string> = {
			create: 'Review comment added',
			reply: 'Review comment answered',
			update: 'Review comment changed',
			decide: 'Review decision',
		};
		const body = typeof after.body === 'string' ? after.body : undefined;
		return { title: words[e.action] ?? `Review comment (${e.action})`, detail: body?.slice(0, 200) };
	}
	const words: Record<string, string> = {
		create: 'Inspection requested',
		schedule: 'Inspection scheduled',
		record: 'Inspection result recorded',
		update: 'Inspection changed',
	};
	const kind = typeof after.kind === 'string' ? ` (${after.kind})` : '';
	return { title: `${words[e.action] ?? `Inspection (${e.action})`}${kind}` };
}

/**
 * Merges the workflow entries with the record edits (newest first from the audit API), each run of
 * edits between two moves as one summary line. Oldest first.
 */
export function mergeTimeline(entries: TimelineEntry[], edits: AuditEntry[]): TimelineItem[] {
	const records = edits
		.filter((a) => a.entity in ENTITY_WORDS)
		.sort((a, b) => a.at.localeCompare(b.at) || Number(a.id) - Number(b.id));
	const out: TimelineItem[] = [];
	let run: EditsSummary | null = null;
	let i = 0;
	const flush = () => {
		if (run) out.push(run);
		run = null;
	};
	for (const e of entries) {
		while (i < records.length && records[i]!.at <= e.at) {
			const a = records[i++]!;
			run ??= { kind: 'edits', id: `edits-${a.id}`, at: a.at, count: 0, byEntity: {}, people: [] };
			run.count++;
			run.byEntity[a.entity] = (run.byEntity[a.entity] ?? 0) + 1;
			if (a.userName && !run.people.includes(a.userName)) run.people.push(a.userName);
		}
		flush();
		out.push(e);
	}
	while (i < records.length) {
		const a = records[i++]!;
		run ??= { kind: 'edits', id: `edits-${a.id}`, at: a.at, count: 0, byEntity: {}, people: [] };
		run.count++;
		run.byEntity[a.entity] = (run.byEntity[a.entity] ?? 0) + 1;
		if (a.userName && !run.people.includes(a.userName)) run.people.push(a.userName);
	}
	flush();
	return out;
}

function editsLine(s: EditsSummary): string {
	const parts = Object.entries(s.byEntity).map(([k, n]) => {
		const [one, many] = ENTITY_WORDS[k] ?? [k, k];
		return `${n} ${n === 1 ? one : many}`;
	});
	return `${s.count} record edit${s.count === 1 ? '' : 's'}: ${parts.join(', ')}`;
}

/** The permit workflow as a timeline, oldest first: moves, submissions, comments, inspections (and summarised edits). */
export function Timeline({ items }: { items: TimelineItem[] }) {
	if (items.length === 0)
		return <p className="text-sm text-ink-500">Nothing has happened on the permit yet.</p>;
	return (
		<ol className="relative ml-2 border-l border-ink-200" data-testid="timeline">
			{items.map((item) => {
				const edits = item.kind === 'edits';
				const text = edits ? { title: editsLine(item) } : describeEntry(item);
				const who = edits ? item.people.join(', ') : item.user?.name;
				return (
					<li key={item.id} className="mb-3 ml-4" data-entity={edits ? 'edits' : item.entity}>
						<span
							aria-hidden="true"
							className={`absolute -left-1.5 mt-1.5 h-3 w-3 rounded-full border-2 border-white ${
								edits ? 'bg-ink-300' : item.entity === 'revision' ? 'bg-copper-500' : 'bg-signal-note'
							}`}
						/>
						<p className={edits ? 'text-sm text-ink-600' : 'text-sm font-semibold text-ink-950'}>
							{text.title}
						</p>
						{text.detail && <p className="text-sm text-ink-700">{text.detail}</p>}
						<p className="text-xs text-ink-500">
							{edits ? `from ${when(item.at)}` : when(item.at)}
							{who ? ` · ${who}` : ''}
						</p>
					</li>
				);
			})}
		</ol>
	);
}

/**
 * The job's history for its firm: the workflow timeline with the record edits (from the audit API)
 * summarised between the moves. `refreshKey` reloads it after a change on the page.
 */
export default function JobHistory({ jobId, refreshKey = '' }: { jobId: string; refreshKey?: string }) {
	const history = useResource(async () => {
		const [workflow, audit] = await Promise.all([
			api<WorkflowState>(`/api/jobs/${jobId}/workflow`),
			api<{ items: AuditEntry[] }>(`/api/jobs/${jobId}/audit?pageSize=100`),
		]);
		return mergeTimeline(workflow.timeline, audit.items);
	}, `${jobId}|${refreshKey}`);
	if (history.error)
		return (
			<Notice tone="error">
				{history.error}{' '}
				<button type="button" className="underline" onClick={() => void history.reload()}>
					Retry
				</button>
			</Notice>
		);
	if (!history.data) return <p className="text-sm text-ink-500">Loading the history…</p>;
	return <Timeline items={history.data} />;
}

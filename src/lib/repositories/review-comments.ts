import type { Knex } from 'knex';
import type { JobRef } from '../access';
import { errors } from '../errors';
import {
	THREAD_OPEN_STATUSES,
	type CommentAction,
	type CommentEntryInput,
	type CommentStatus,
	type ReviewCommentInput,
} from '../schemas/review-comment';
import { UNDER_REVIEW } from '../workflow/status';
import { recordAudit } from './audit';
import { getRevision } from './revisions';

export interface CommentEntryView {
	id: string;
	action: CommentAction;
	body: string;
	authorName: string | null;
	createdAt: string;
}

export interface CommentView {
	id: string;
	/** The comment's number within its job (1, 2, …), in the order they were written. */
	number: number;
	revision: number;
	targetKind: 'sheet' | 'panel' | 'circuit' | 'job';
	sheet: number | null;
	point: { x: number; y: number } | null;
	panelId: string | null;
	circuitId: string | null;
	targetLabel: string;
	body: string;
	status: CommentStatus;
	version: number;
	authorName: string | null;
	createdAt: string;
	updatedAt: string;
	entries: CommentEntryView[];
}

const iso = (d: unknown) => new Date(d as string).toISOString();

/** A job's review comments with their threads, in the order they were written. */
export async function listComments(knex: Knex, jobId: string, ids?: string[]): Promise<CommentView[]> {
	const numbered = knex('review_comments')
		.where({ job_id: jobId })
		.select('*', knex.raw('row_number() over (order by seq)::int as number'))
		.as('c');
	const q = knex.from(numbered).leftJoin('users as u', 'u.id', 'c.author_id');
	if (ids) q.whereIn('c.id', ids);
	const rows = await q.orderBy('c.seq').select('c.*', 'u.name as author_name');
	if (rows.length === 0) return [];
	const entries = await knex('review_comment_entries as e')
		.leftJoin('users as u', 'u.id', 'e.author_id')
		.whereIn(
			'e.comment_id',
			rows.map((r) => r.id),
		)
		.orderBy('e.id')
		.select('e.*', 'u.name as author_name');
	return rows.map((r) => ({
		id: r.id,
		number: Number(r.number),
		revision: r.revision_number,
		targetKind: r.target_kind,
		sheet: r.sheet ?? null,
		point: r.point_x === null ? null : { x: r.point_x, y: r.point_y },
		panelId: r.panel_id ?? null,
		circuitId: r.circuit_id ?? null,
		targetLabel: r.target_label,
		body: r.body,
		status: r.status,
		version: r.version,
		authorName: r.author_name ?? null,
		createdAt: iso(r.created_at),
		updatedAt: iso(r.updated_at),
		entries: entries
			.filter((e) => e.comment_id === r.id)
			.map((e) => ({
				id: String(e.id),
				action: e.action,
				body: e.body,
				authorName: e.author_name ?? null,
				createdAt: iso(e.created_at),
			})),
	}));
}

/** The comments a decision must consider: those not yet resolved, oldest first. */
export async function unresolvedComments(knex: Knex, jobId: string): Promise<CommentView[]> {
	const ids = await knex('review_comments')
		.where({ job_id: jobId })
		.whereNot({ status: 'resolved' })
		.pluck('id');
	return ids.length ? listComments(knex, jobId, ids) : [];
}

/** The job a comment belongs to, or null (for the route's access check). */
export async function commentJobId(knex: Knex, commentId: string): Promise<string | null> {
	if (!/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(commentId)) return null;
	const row = await knex('review_comments').where({ id: commentId }).first('job_id');
	return row?.job_id ?? null;
}

/**
 * Writes a reviewer's comment on a submitted revision (the latest unless named). The sheet must be
 * one of the revision's packet sheets, the panel or circuit one of the revision's own; their label
 * is kept with the comment, as the live job may later rename or delete them. Comments are written
 * while the packet is with the reviewer (submitted, in review, resubmitted).
 */
export async function createComment(
	knex: Knex,
	userId: string,
	jobId: string,
	input: ReviewCommentInput,
): Promise<CommentView> {
	const id = await knex.transaction(async (trx) => {
		const job = await trx<JobRef>('jobs')
			.where({ id: jobId })
			.forUpdate()
			.first('status', 'current_revision');
		if (!job) throw errors.notFound('job');
		if (!UNDER_REVIEW.includes(job.status)) {
			throw errors.conflict('Comments are written while the packet is in plan review.', {
				status: job.status,
			});
		}
		const revision = input.revision ?? job.current_revision;
		const target = revision <= job.current_revision ? await getRevision(trx, jobId, revision) : null;
		if (!target) throw errors.invalid('No such revision of this job.', { revision: ['No such revision.'] });
		let label = 'Whole job';
		let panelId: string | null = null;
		let circuitId: string | null = null;
		if (input.targetKind === 'sheet') {
			if (input.sheet! > target.packetPages) {
				throw errors.invalid(`The packet of revision ${revision} has ${target.packetPages} sheets.`, {
					sheet: [`Choose a sheet from 1 to ${target.packetPages}.`],
				});
			}
			label = `Sheet ${input.sheet} of ${target.packetPages}`;
		} else if (input.targetKind === 'panel') {
			const panel = target.document.panels.find((p) => p.id === input.panelId);
			if (!panel)
				throw errors.invalid('That panel is not in this revision.', {
					panelId: ['Choose a panel of the revision.'],
				});
			panelId = panel.id;
			label = `Panel ${panel.name}`;
		} else if (input.targetKind === 'circuit') {
			const circuit = target.document.circuits.find((c) => c.id === input.circuitId);
			if (!circuit) {
				throw errors.invalid('That circuit is not in this revision.', {
					circuitId: ['Choose a circuit of the revision.'],
				});
			}
			const panel = target.document.panels.find((p) => p.id === circuit.panelId);
			circuitId = circuit.id;
			panelId = circuit.panelId;
			label = `${panel ? `Panel ${panel.name}, ` : ''}circuit ${circuit.position}: ${circuit.label}`.slice(
				0,
				200,
			);
		}
		const [row] = await trx('review_comments')
			.insert({
				job_id: jobId,
				revision_number: revision,
				author_id: userId,
				target_kind: input.targetKind,
				sheet: input.targetKind === 'sheet' ? input.sheet : null,
				point_x: input.point?.x ?? null,
				point_y: input.point?.y ?? null,
				panel_id: panelId,
				circuit_id: circuitId,
				target_label: label,
				body: input.body,
			})
			.returning(['id', 'seq']);
		await recordAudit(trx, {
			jobId,
			userId,
			entity: 'comment',
			entityId: row.id,
			action: 'create',
			before: null,
			after: { revision, targetKind: input.targetKind, targetLabel: label, body: input.body },
		});
		return row.id as string;
	});
	return (await listComments(knex, jobId, [id]))[0]!;
}

/** Which status each thread action leads to, from which statuses, and which side may take it. */
const FLOW: Record<
	CommentAction,
	{ from: CommentStatus[]; to: CommentStatus | null; by: ('contractor' | 'inspector')[] }
> = {
	reply: { from: ['open', 'addressed', 'resolved'], to: null, by: ['contractor', 'inspector'] },
	addressed: { from: ['open'], to: 'addressed', by: ['contractor'] },
	resolved: { from: ['open', 'addressed'], to: 'resolved', by: ['inspector'] },
	reopened: { from: ['addressed', 'resolved'], to: 'open', by: ['inspector'] },
};

/**
 * Adds an entry to a comment's thread: an answer, "addressed" (the contractor), "resolved" or
 * "reopened" (the reviewer). The wrong side is a 403, a move the comment's status does not allow a 409.
 */
export async function addCommentEntry(
	knex: Knex,
	userId: string,
	sides: ('contractor' | 'inspector')[],
	commentId: string,
	input: CommentEntryInput,
): Promise<CommentView> {
	const flow = FLOW[input.action];
	if (!flow.by.some((s) => sides.includes(s))) {
		throw errors.forbidden(
			flow.by.includes('contractor')
				? 'Only the contractor’s firm marks a comment addressed.'
				: 'Only an inspector of the job’s jurisdiction resolves or reopens a comment.',
		);
	}
	const jobId = await knex.transaction(async (trx) => {
		const c = await trx('review_comments')
			.where({ id: commentId })
			.forUpdate()
			.first('id', 'job_id', 'status');
		if (!c) throw errors.notFound('comment');
		const job = await trx('jobs').where({ id: c.job_id }).first('status');
		if (!THREAD_OPEN_STATUSES.includes(job.status)) {
			throw errors.conflict('The plan review of this job is over: its comments take no more entries.', {
				status: job.status,
			});
		}
		if (!flow.from.includes(c.status)) {
			throw errors.conflict(
				c.status === 'resolved'
					? 'The comment is already resolved.'
					: `A comment that is ${c.status} cannot be marked ${input.action}.`,
				{ status: c.status },
			);
		}
		await trx('review_comment_entries').insert({
			comment_id: commentId,
			author_id: userId,
			action: input.action,
			body: input.body,
		});
		const to = flow.to ?? c.status;
		await trx('review_comments')
			.where({ id: commentId })
			.update({
				status: to,
				updated_at: trx.fn.now(),
				...(flow.to ? { version: trx.raw('version + 1') } : {}),
			});
		await recordAudit(trx, {
			jobId: c.job_id,
			userId,
			entity: 'comment',
			entityId: commentId,
			action: 'reply',
			before: { status: c.status },
			after: { status: to, action: input.action, ...(input.body ? { body: input.body } : {}) },
		});
		return c.job_id as string;
	});
	return (await listComments(knex, jobId, [commentId]))[0]!;
}

import type { Knex } from 'knex';
import type { CommentForDiff, RevisionSnapshot } from '../workflow/revision-diff';
import { getRevision } from './revisions';

/** One stored revision's document and results (through the revisions repository), or null when there is none. */
export async function revisionSnapshot(
	knex: Knex,
	jobId: string,
	number: number,
): Promise<RevisionSnapshot | null> {
	const r = await getRevision(knex, jobId, number);
	if (!r) return null;
	return { number: r.number, document: r.document, results: r.results, submittedAt: r.submittedAt };
}

/**
 * The review comments of a job made on revisions up to `upTo`, pinned to a panel, circuit, sheet or
 * the job, each with the answers written by the job's firm (the contractor's side of the thread).
 */
export async function commentsForDiff(
	knex: Knex,
	job: { id: string; firm_id: string },
	upTo: number,
): Promise<CommentForDiff[]> {
	const rows = await knex('review_comments')
		.where({ job_id: job.id })
		.where('revision_number', '<=', upTo)
		.orderBy('seq')
		.select(
			'id',
			'revision_number',
			'target_kind',
			'panel_id',
			'circuit_id',
			'target_label',
			'sheet',
			'body',
			'status',
		);
	if (rows.length === 0) return [];
	const entries = await knex('review_comment_entries as e')
		.join('firm_members as m', function () {
			this.on('m.user_id', '=', 'e.author_id').andOn('m.firm_id', '=', knex.raw('?', [job.firm_id]));
		})
		.leftJoin('users as u', 'u.id', 'e.author_id')
		.whereIn(
			'e.comment_id',
			rows.map((r) => r.id),
		)
		.where('e.body', '<>', '')
		.orderBy('e.id')
		.select('e.comment_id', 'e.body', 'e.created_at', 'u.name as author_name');
	return rows.map((r) => ({
		id: r.id,
		revisionNumber: r.revision_number,
		targetKind: r.target_kind,
		panelId: r.panel_id,
		circuitId: r.circuit_id,
		targetLabel: r.target_label,
		sheet: r.sheet,
		body: r.body,
		status: r.status,
		answers: entries
			.filter((e) => e.comment_id === r.id)
			.map((e) => ({
				body: e.body,
				authorName: e.author_name ?? null,
				at: new Date(e.created_at).toISOString(),
			})),
	}));
}

import type { Knex } from 'knex';
import {
	hashMapToken,
	looksLikeMapToken,
	newMapToken,
	sealMapToken,
	unsealMapToken,
} from '../panel-map-token';

export interface MapTokenInfo {
	id: string;
	jobId: string;
	/** The token, or null when it can no longer be unsealed (the app's secret changed): reissue it. */
	token: string | null;
	createdAt: string;
	createdBy: string | null;
	createdByName: string | null;
}

function info(row: Record<string, unknown>): MapTokenInfo {
	return {
		id: row.id as string,
		jobId: row.job_id as string,
		token: unsealMapToken(row.token_sealed as string),
		createdAt: (row.created_at as Date).toISOString(),
		createdBy: (row.created_by as string | null) ?? null,
		createdByName: (row.created_by_name as string | null) ?? null,
	};
}

/** The job's live panel map link, or null. */
export async function liveMapToken(knex: Knex, jobId: string): Promise<MapTokenInfo | null> {
	const row = await knex('panel_map_tokens as t')
		.leftJoin('users as u', 'u.id', 't.created_by')
		.where({ 't.job_id': jobId })
		.whereNull('t.revoked_at')
		.first('t.*', 'u.name as created_by_name');
	return row ? info(row) : null;
}

/** Revokes the live link (if any) and issues a new one, in one transaction. */
export async function reissueMapToken(knex: Knex, jobId: string, userId: string): Promise<MapTokenInfo> {
	return knex.transaction(async (trx) => {
		await trx('jobs').where({ id: jobId }).forUpdate().first('id');
		await trx('panel_map_tokens')
			.where({ job_id: jobId })
			.whereNull('revoked_at')
			.update({ revoked_at: trx.fn.now(), revoked_by: userId });
		const token = newMapToken();
		await trx('panel_map_tokens').insert({
			job_id: jobId,
			token_hash: hashMapToken(token),
			token_sealed: sealMapToken(token),
			created_by: userId,
		});
		return (await liveMapToken(trx, jobId))!;
	});
}

/** The live link, issuing one when the job has none. */
export async function ensureMapToken(knex: Knex, jobId: string, userId: string): Promise<MapTokenInfo> {
	const live = await liveMapToken(knex, jobId);
	if (live?.token) return live;
	return reissueMapToken(knex, jobId, userId);
}

/** Revokes the job's live link; returns how many were revoked (0 or 1). */
export async function revokeMapToken(knex: Knex, jobId: string, userId: string): Promise<number> {
	return knex('panel_map_tokens')
		.where({ job_id: jobId })
		.whereNull('revoked_at')
		.update({ revoked_at: knex.fn.now(), revoked_by: userId });
}

/** The job a live token opens, or null (unknown, revoked, or the job deleted). */
export async function jobIdForMapToken(knex: Knex, token: string): Promise<string | null> {
	if (!looksLikeMapToken(token)) return null;
	const row = await knex('panel_map_tokens as t')
		.join('jobs as j', 'j.id', 't.job_id')
		.where({ 't.token_hash': hashMapToken(token) })
		.whereNull('t.revoked_at')
		.whereNull('j.deleted_at')
		.first('t.job_id');
	return row ? (row.job_id as string) : null;
}

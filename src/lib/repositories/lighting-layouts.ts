import type { Knex } from 'knex';
import type { RecessedLayoutInput } from '../electrical';
import type { LightingLayoutValues } from '../schemas/lighting-layout';

export interface LightingLayoutRecord {
	id: string;
	jobId: string;
	roomId: string | null;
	roomName: string | null;
	title: string;
	input: RecessedLayoutInput;
	createdAt: string;
}

function fromRow(r: Record<string, unknown>): LightingLayoutRecord {
	return {
		id: r.id as string,
		jobId: r.job_id as string,
		roomId: (r.room_id as string | null) ?? null,
		roomName: (r.room_name as string | null) ?? null,
		title: r.title as string,
		input: r.input as RecessedLayoutInput,
		createdAt: (r.created_at as Date).toISOString(),
	};
}

/** A job's saved lighting layouts, oldest first. */
export async function listLightingLayouts(knex: Knex, jobId: string): Promise<LightingLayoutRecord[]> {
	const rows = await knex('lighting_layouts as l')
		.leftJoin('rooms as r', 'r.id', 'l.room_id')
		.where({ 'l.job_id': jobId })
		.orderBy([{ column: 'l.created_at' }, { column: 'l.id' }])
		.select('l.*', 'r.name as room_name');
	return rows.map(fromRow);
}

/** Saves a layout for a job. */
export async function createLightingLayout(
	knex: Knex,
	jobId: string,
	userId: string,
	values: LightingLayoutValues,
): Promise<LightingLayoutRecord> {
	const [{ id }] = await knex('lighting_layouts')
		.insert({
			job_id: jobId,
			room_id: values.roomId,
			title: values.title,
			input: JSON.stringify(values.input),
			created_by: userId,
		})
		.returning('id');
	return (await listLightingLayouts(knex, jobId)).find((l) => l.id === id)!;
}

/** The job a layout belongs to, or null. */
export async function lightingLayoutJobId(knex: Knex, id: string): Promise<string | null> {
	if (!/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(id)) return null;
	const row = await knex('lighting_layouts').where({ id }).first('job_id');
	return row ? (row.job_id as string) : null;
}

/** Deletes a layout. */
export async function deleteLightingLayout(knex: Knex, id: string): Promise<void> {
	await knex('lighting_layouts').where({ id }).delete();
}

import type { Knex } from 'knex';
import { errors } from '../errors';
import type { PanelInput, PanelPatch } from '../schemas/panel';
import { recordAudit } from './audit';
import { listCircuits } from './circuits';
import { consistencyGuard } from './consistency';
import { listLoadsOfCircuits } from './loads';
import { panelFromRow, panelToRow, type CircuitRecord, type LoadRecord, type PanelRecord } from './rows';
import { bump, inTransaction, lockVersion, type Actor } from './versioned';

/** A job's panels, as entered. */
export async function listPanels(knex: Knex, jobId: string): Promise<PanelRecord[]> {
	const rows = await knex('panels').where({ job_id: jobId }).orderBy('seq');
	return rows.map(panelFromRow);
}

export async function getPanel(knex: Knex, id: string): Promise<PanelRecord | null> {
	const row = await knex('panels').where({ id }).first();
	return row ? panelFromRow(row) : null;
}

/** The job a panel belongs to, or null. */
export async function panelJobId(knex: Knex, id: string): Promise<string | null> {
	const row = await knex('panels').where({ id }).first('job_id');
	return row?.job_id ?? null;
}

/** A panel with its circuits (by position) and their loads. */
export async function getPanelWithCircuits(
	knex: Knex,
	id: string,
): Promise<{ panel: PanelRecord; circuits: CircuitRecord[]; loads: LoadRecord[] } | null> {
	const panel = await getPanel(knex, id);
	if (!panel) return null;
	const circuits = await listCircuits(knex, id);
	const loads = await listLoadsOfCircuits(
		knex,
		circuits.map((c) => c.id),
	);
	return { panel, circuits, loads };
}

/** The rules on a panel's feeder the database cannot say in words: main has none, sub names one of this job's circuits, once. */
async function checkFeeder(
	trx: Knex.Transaction,
	jobId: string,
	panelId: string | null,
	p: PanelInput,
): Promise<void> {
	if (p.kind === 'main' && p.fedFromCircuitId !== null) {
		throw errors.invalid('Some fields need attention.', {
			fedFromCircuitId: [
				'a main panel is supplied by the service; leave the feeder empty or make it a subpanel',
			],
		});
	}
	if (p.kind === 'sub' && p.fedFromCircuitId === null) {
		throw errors.invalid('Some fields need attention.', {
			fedFromCircuitId: [
				'choose the circuit (a 2-pole breaker in another panel) that supplies this subpanel',
			],
		});
	}
	if (p.fedFromCircuitId === null) return;
	const feeder = await trx('circuits as c')
		.join('panels as p', 'p.id', 'c.panel_id')
		.where({ 'c.id': p.fedFromCircuitId, 'p.job_id': jobId })
		.first('c.id');
	if (!feeder)
		throw errors.invalid('Some fields need attention.', {
			fedFromCircuitId: ['no circuit of this job has this id'],
		});
	const taken = await trx('panels')
		.where({ fed_from_circuit_id: p.fedFromCircuitId })
		.whereNot({ id: panelId ?? '00000000-0000-0000-0000-000000000000' })
		.first('name');
	if (taken) {
		throw errors.invalid('Some fields need attention.', {
			fedFromCircuitId: [
				`this circuit already supplies panel “${taken.name}”; give each subpanel its own feeder breaker`,
			],
		});
	}
}

export async function createPanel(
	knex: Knex,
	actor: Actor,
	jobId: string,
	input: PanelInput,
): Promise<PanelRecord> {
	return inTransaction(knex, async (trx) => {
		await trx('jobs').where({ id: jobId }).forUpdate().first('id');
		await checkFeeder(trx, jobId, null, input);
		const guard = await consistencyGuard(trx, jobId);
		const [row] = await trx('panels')
			.insert({ job_id: jobId, ...panelToRow(input) })
			.returning('*');
		const panel = panelFromRow(row);
		await guard.check(panel.id);
		await recordAudit(trx, {
			jobId,
			userId: actor.id,
			entity: 'panel',
			entityId: panel.id,
			action: 'create',
			before: null,
			after: panel,
		});
		return panel;
	});
}

/** Changes a panel; fewer spaces than its breakers need is a 409 naming the breaker. */
export async function updatePanel(
	knex: Knex,
	actor: Actor,
	id: string,
	patch: PanelPatch,
): Promise<PanelRecord> {
	return inTransaction(knex, async (trx) => {
		const before = await lockVersion(trx, 'panels', id, patch.version, () => getPanel(trx, id), 'panel');
		const { version: _v, ...fields } = patch;
		const merged = {
			...before,
			...Object.fromEntries(Object.entries(fields).filter(([, v]) => v !== undefined)),
		} as PanelRecord;
		await checkFeeder(trx, before.jobId, id, merged);
		if (merged.spaces < before.spaces) {
			const beyond = await trx('circuits')
				.where({ panel_id: id })
				.whereRaw('position + 2 * (poles - 1) > ?', [merged.spaces])
				.orderBy('position')
				.first('position', 'poles', 'label');
			if (beyond) {
				throw errors.invalid('The panel has breakers beyond the new number of spaces.', {
					spaces: [
						`the breaker at position ${beyond.position}${beyond.label ? ` (${beyond.label})` : ''} needs position ${beyond.position + 2 * (beyond.poles - 1)}; move or delete it first`,
					],
				});
			}
		}
		const guard = await consistencyGuard(trx, before.jobId);
		await trx('panels')
			.where({ id })
			.update({ ...panelToRow(merged), ...bump(trx) });
		await guard.check(id);
		const after = (await getPanel(trx, id))!;
		await recordAudit(trx, {
			jobId: before.jobId,
			userId: actor.id,
			entity: 'panel',
			entityId: id,
			action: 'update',
			before,
			after,
		});
		return after;
	});
}

/**
 * Deletes a panel with its circuits and their loads in one transaction, an audit row each. Refused
 * (409) while a subpanel is fed from one of its circuits.
 */
export async function deletePanel(
	knex: Knex,
	actor: Actor,
	id: string,
	version: number,
): Promise<{ circuits: number; loads: number }> {
	return inTransaction(knex, async (trx) => {
		const before = await lockVersion(trx, 'panels', id, version, () => getPanel(trx, id), 'panel');
		const fedSub = await trx('panels as sub')
			.join('circuits as c', 'c.id', 'sub.fed_from_circuit_id')
			.where('c.panel_id', id)
			.first('sub.name', 'c.position');
		if (fedSub) {
			throw errors.conflict(
				`Subpanel “${fedSub.name}” is fed from the breaker at position ${fedSub.position} of this panel. Delete that subpanel, or feed it from another circuit, first.`,
			);
		}
		const circuits = await listCircuits(trx, id);
		const loads = await listLoadsOfCircuits(
			trx,
			circuits.map((c) => c.id),
		);
		const audit = { jobId: before.jobId, userId: actor.id, action: 'delete' as const, after: null };
		for (const l of loads) await recordAudit(trx, { ...audit, entity: 'load', entityId: l.id, before: l });
		for (const c of circuits)
			await recordAudit(trx, { ...audit, entity: 'circuit', entityId: c.id, before: c });
		await trx('panels').where({ id }).delete();
		await recordAudit(trx, { ...audit, entity: 'panel', entityId: id, before });
		return { circuits: circuits.length, loads: loads.length };
	});
}

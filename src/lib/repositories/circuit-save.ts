import type { Knex } from 'knex';
import { AppError, errors } from '../errors';
import type { CircuitSave, CircuitWithLoadsInput } from '../schemas/circuit';
import type { LoadInput } from '../schemas/load';
import { recordAudit, type AuditInput } from './audit';
import {
	assertMultiwirePartner,
	assertPositionFree,
	getCircuit,
	lockPanel,
	mergeCircuitChanges,
} from './circuits';
import { consistencyGuard } from './consistency';
import { assertRoomsOfJob, setRoomLinks } from './jobs';
import { listLoadsOfCircuits } from './loads';
import { circuitToRow, loadToRow, type CircuitRecord, type LoadRecord } from './rows';
import { bump, inTransaction, type Actor } from './versioned';

/** A circuit with its loads, as the save endpoints answer. */
export interface CircuitWithLoads {
	circuit: CircuitRecord;
	loads: LoadRecord[];
}

/** Runs a check whose field messages belong to one item of the request (`roomIds.0` → `loads.2.roomIds.0`). */
async function under<T>(prefix: string, fn: () => Promise<T>): Promise<T> {
	try {
		return await fn();
	} catch (err) {
		if (err instanceof AppError && err.code === 'validation' && err.fields) {
			const fields = Object.fromEntries(
				Object.entries(err.fields).map(([k, v]) => [k === '_' ? prefix.replace(/\.$/, '') : prefix + k, v]),
			);
			throw new AppError('validation', err.message, { fields });
		}
		throw err;
	}
}

async function insertLoad(trx: Knex.Transaction, circuitId: string, load: LoadInput): Promise<string> {
	const [row] = await trx('loads')
		.insert({ circuit_id: circuitId, ...loadToRow(load) })
		.returning('id');
	await setRoomLinks(trx, 'load_rooms', 'load_id', row.id, load.roomIds);
	return row.id as string;
}

const sameRooms = (a: readonly string[], b: readonly string[]) =>
	a.length === b.length && a.every((id, i) => id === b[i]);

const loadsByPath = (ids: string[]) => new Map(ids.map((id, i) => [id, `loads.${i}.`]));

/**
 * Adds a breaker and its loads in one transaction: the same checks as adding them one by one (free
 * position, rooms of the job, the engine's cross-checks), field messages keyed `loads.<i>.<field>`
 * for the loads, and an audit row for each record. Any problem writes nothing.
 */
export async function createCircuitWithLoads(
	knex: Knex,
	actor: Actor,
	panelId: string,
	input: CircuitWithLoadsInput,
): Promise<CircuitWithLoads> {
	return inTransaction(knex, async (trx) => {
		const panel = await lockPanel(trx, panelId);
		if (!panel) throw errors.notFound('panel');
		const { loads: loadInputs, ...circuitInput } = input;
		await assertRoomsOfJob(trx, panel.jobId, circuitInput.roomIds);
		await assertMultiwirePartner(trx, panel.jobId, circuitInput.multiwireWith);
		await assertPositionFree(trx, panel, circuitInput.position, circuitInput.poles, null);
		for (const [i, l] of loadInputs.entries())
			await under(`loads.${i}.`, () => assertRoomsOfJob(trx, panel.jobId, l.roomIds));
		const guard = await consistencyGuard(trx, panel.jobId);
		const [row] = await trx('circuits')
			.insert({ panel_id: panelId, ...circuitToRow(circuitInput) })
			.returning('id');
		const circuitId = row.id as string;
		await setRoomLinks(trx, 'circuit_rooms', 'circuit_id', circuitId, circuitInput.roomIds);
		const loadIds: string[] = [];
		for (const l of loadInputs) loadIds.push(await insertLoad(trx, circuitId, l));
		await guard.checkAll(new Map([[circuitId, ''], ...loadsByPath(loadIds)]));
		const circuit = (await getCircuit(trx, circuitId))!;
		const loads = await listLoadsOfCircuits(trx, [circuitId]);
		const audit = { jobId: panel.jobId, userId: actor.id, action: 'create' as const, before: null };
		await recordAudit(trx, { ...audit, entity: 'circuit', entityId: circuitId, after: circuit });
		for (const l of loads) await recordAudit(trx, { ...audit, entity: 'load', entityId: l.id, after: l });
		return { circuit, loads };
	});
}

/**
 * Saves a circuit and its loads in one transaction: changes the circuit, updates the loads sent with
 * an id, adds those without, deletes `deleteLoads`. The request must account for every load the
 * circuit has now, with the versions it read: a stale circuit or load, a load deleted meanwhile or one
 * added by someone else answers 409 with `current: { circuit, loads }` and writes nothing. Records
 * that did not change are left alone (no new version, no audit row).
 */
export async function saveCircuitWithLoads(
	knex: Knex,
	actor: Actor,
	id: string,
	body: CircuitSave,
): Promise<CircuitWithLoads> {
	return inTransaction(knex, async (trx) => {
		const located = await trx('circuits').where({ id }).first('panel_id');
		if (!located) throw errors.notFound('circuit');
		// Lock order as elsewhere: panel, then circuit, then its loads.
		const panel = (await lockPanel(trx, located.panel_id))!;
		const lockedCircuit = await trx('circuits').where({ id }).forUpdate().first('version');
		if (!lockedCircuit) throw errors.notFound('circuit');
		await trx('loads').where({ circuit_id: id }).forUpdate().select('id');
		const before = (await getCircuit(trx, id))!;
		const loadsBefore = await listLoadsOfCircuits(trx, [id]);

		const { version, loads: items, deleteLoads, ...fields } = body;
		const stale = staleness(before, loadsBefore, version, items, deleteLoads);
		if (stale) throw errors.conflict(stale, { circuit: before, loads: loadsBefore });

		const merged = await mergeCircuitChanges(trx, panel, before, fields);
		for (const [i, l] of items.entries())
			await under(`loads.${i}.`, () => assertRoomsOfJob(trx, before.jobId, l.roomIds));

		const guard = await consistencyGuard(trx, before.jobId);
		const circuitChanged =
			JSON.stringify(circuitToRow(merged)) !== JSON.stringify(circuitToRow(before)) ||
			!sameRooms(merged.roomIds, before.roomIds);
		if (circuitChanged) {
			await trx('circuits')
				.where({ id })
				.update({ ...circuitToRow(merged), ...bump(trx) });
			await setRoomLinks(trx, 'circuit_rooms', 'circuit_id', id, merged.roomIds);
		}
		if (deleteLoads.length)
			await trx('loads')
				.whereIn(
					'id',
					deleteLoads.map((d) => d.id),
				)
				.delete();
		const loadIds: string[] = [];
		const changedLoads = new Set<string>();
		for (const item of items) {
			const { id: loadId, version: _v, ...input } = item;
			if (loadId === undefined) {
				const newId = await insertLoad(trx, id, input);
				loadIds.push(newId);
				changedLoads.add(newId);
				continue;
			}
			loadIds.push(loadId);
			const old = loadsBefore.find((l) => l.id === loadId)!;
			if (
				JSON.stringify(loadToRow(input)) === JSON.stringify(loadToRow(old)) &&
				sameRooms(input.roomIds, old.roomIds)
			)
				continue;
			changedLoads.add(loadId);
			await trx('loads')
				.where({ id: loadId })
				.update({ ...loadToRow(input), ...bump(trx) });
			await setRoomLinks(trx, 'load_rooms', 'load_id', loadId, input.roomIds);
		}
		await guard.checkAll(new Map([[id, ''], ...loadsByPath(loadIds)]));

		const circuit = (await getCircuit(trx, id))!;
		const loads = await listLoadsOfCircuits(trx, [id]);
		const audit: Omit<AuditInput, 'entity' | 'entityId' | 'action' | 'before' | 'after'> = {
			jobId: before.jobId,
			userId: actor.id,
		};
		if (circuitChanged)
			await recordAudit(trx, {
				...audit,
				entity: 'circuit',
				entityId: id,
				action: 'update',
				before,
				after: circuit,
			});
		for (const d of deleteLoads) {
			const old = loadsBefore.find((l) => l.id === d.id)!;
			await recordAudit(trx, {
				...audit,
				entity: 'load',
				entityId: d.id,
				action: 'delete',
				before: old,
				after: null,
			});
		}
		for (const l of loads) {
			if (!changedLoads.has(l.id)) continue;
			const old = loadsBefore.find((x) => x.id === l.id) ?? null;
			await recordAudit(trx, {
				...audit,
				entity: 'load',
				entityId: l.id,
				action: old ? 'update' : 'create',
				before: old,
				after: l,
			});
		}
		return { circuit, loads };
	});
}

/** Why a save was made on an out-of-date view of the circuit and its loads, or null when it was not. */
function staleness(
	circuit: CircuitRecord,
	loads: LoadRecord[],
	version: number,
	items: CircuitSave['loads'],
	deleteLoads: CircuitSave['deleteLoads'],
): string | null {
	const again = 'Review the current values and apply your change again.';
	if (circuit.version !== version)
		return `This circuit was changed by someone else since you opened it (you had version ${version}, it is now version ${circuit.version}). ${again}`;
	const byId = new Map(loads.map((l) => [l.id, l]));
	const named = (l: LoadRecord) => `Load “${l.description || l.kind}”`;
	const sent = [
		...items.filter((l) => l.id !== undefined).map((l) => ({ id: l.id!, version: l.version! })),
		...deleteLoads,
	];
	for (const s of sent) {
		const now = byId.get(s.id);
		if (!now)
			return `A load you had open is no longer on this circuit (someone else deleted or moved it). ${again}`;
		if (now.version !== s.version)
			return `${named(now)} was changed by someone else since you opened it (you had version ${s.version}, it is now version ${now.version}). ${again}`;
	}
	const accounted = new Set(sent.map((s) => s.id));
	const added = loads.find((l) => !accounted.has(l.id));
	if (added) return `${named(added)} was added to this circuit by someone else since you opened it. ${again}`;
	return null;
}

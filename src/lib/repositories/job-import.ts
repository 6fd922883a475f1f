import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { positionsTaken } from '../electrical/positions';
import { parseJobDocument } from '../electrical/parse';
import type { JobDocument } from '../electrical/schema';
import { errors } from '../errors';
import { documentFieldErrors } from '../job-document';
import { recordAudit } from './audit';
import { getJob, propertyForAddress, setRoomLinks } from './jobs';
import { circuitToRow, loadToRow, panelToRow, roomToRow, type JobRecord } from './rows';
import { inTransaction, type Actor } from './versioned';

/** Position problems the engine leaves to its findings but the database refuses: overlaps, beyond the spaces. */
function positionErrors(doc: JobDocument): string[] {
	const out: string[] = [];
	const spaces = new Map(doc.panels.map((p) => [p.id, p.spaces]));
	const held = new Map<string, Map<number, number>>();
	doc.circuits.forEach((c, i) => {
		const taken = positionsTaken(c.position, c.poles);
		const max = spaces.get(c.panelId);
		if (max !== undefined && taken[taken.length - 1]! > max) {
			out.push(
				`circuits[${i}].position: a ${c.poles}-pole breaker at position ${c.position} does not fit a panel of ${max} spaces`,
			);
			return;
		}
		const panelHeld = held.get(c.panelId) ?? new Map<number, number>();
		held.set(c.panelId, panelHeld);
		for (const p of taken) {
			const other = panelHeld.get(p);
			if (other !== undefined) {
				out.push(`circuits[${i}].position: position ${p} is already taken by circuits[${other}]`);
				return;
			}
		}
		for (const p of taken) panelHeld.set(p, i);
	});
	return out;
}

/** The jurisdiction a document names, matched by name (case and outer spaces aside); an unknown name is a 400. */
async function jurisdictionByName(knex: Knex, name: string | null): Promise<string | null> {
	if (name === null) return null;
	const rows = await knex('jurisdictions')
		.whereRaw('lower(name) = lower(?)', [name.trim()])
		.orderBy('name')
		.limit(2)
		.select('id');
	if (rows.length !== 1) {
		const message =
			rows.length === 0
				? `no jurisdiction named “${name}” on this installation; choose one listed on the new-job form, or null`
				: `more than one jurisdiction is named “${name}”; import without it and choose one on the job page`;
		throw errors.invalid('The job document was not imported: the jurisdiction was not found.', {
			'jurisdiction.name': [message],
		});
	}
	return rows[0].id as string;
}

/**
 * Creates a job for a firm from a job document: validated as a whole first (400 with fields keyed
 * by document path), then written in one transaction with new ids, or not at all.
 */
export async function importJob(
	knex: Knex,
	actor: Actor,
	firmId: string,
	input: unknown,
): Promise<{ job: JobRecord; counts: { rooms: number; panels: number; circuits: number; loads: number } }> {
	const parsed = parseJobDocument(input);
	const problems = parsed.ok ? positionErrors(parsed.doc) : parsed.errors;
	if (!parsed.ok || problems.length) {
		throw errors.invalid(
			`The job document was not imported: ${problems.length} problem${problems.length === 1 ? '' : 's'} to fix.`,
			documentFieldErrors(problems),
		);
	}
	const doc = parsed.doc;
	const jurisdictionId = await jurisdictionByName(knex, doc.jurisdiction?.name ?? null);
	const ids = new Map<string, string>();
	const idOf = (key: string) => {
		let id = ids.get(key);
		if (!id) ids.set(key, (id = randomUUID()));
		return id;
	};
	const room = (id: string) => idOf(`room:${id}`);
	const panel = (id: string) => idOf(`panel:${id}`);
	const circuit = (id: string) => idOf(`circuit:${id}`);

	return inTransaction(knex, async (trx) => {
		const [{ id: jobId }] = await trx('jobs')
			.insert({
				firm_id: firmId,
				created_by: actor.id,
				property_id: await propertyForAddress(trx, doc.address, jurisdictionId),
				jurisdiction_id: jurisdictionId,
				name: doc.name,
				address: doc.address,
				code_edition: doc.codeEdition,
				terminal_temperature_c: doc.terminalTemperatureC,
				floor_area_ft2: doc.floorAreaFt2,
				service_rating_a: doc.service.ratingA,
				voltage_system: doc.service.voltageSystem,
				existing_peak_demand_kw: doc.service.existingLoad?.peakDemandKW ?? null,
			})
			.returning('id');
		if (doc.rooms.length) {
			await trx('rooms').insert(doc.rooms.map((r) => ({ id: room(r.id), job_id: jobId, ...roomToRow(r) })));
		}
		await trx('panels').insert(
			doc.panels.map((p) => ({
				id: panel(p.id),
				job_id: jobId,
				...panelToRow({ ...p, fedFromCircuitId: null }),
			})),
		);
		if (doc.circuits.length) {
			await trx('circuits').insert(
				doc.circuits.map((c) => ({
					id: circuit(c.id),
					panel_id: panel(c.panelId),
					...circuitToRow({ ...c, multiwireWith: null }),
				})),
			);
		}
		for (const c of doc.circuits) {
			if (c.multiwireWith)
				await trx('circuits')
					.where({ id: circuit(c.id) })
					.update({ multiwire_with_id: circuit(c.multiwireWith) });
			await setRoomLinks(trx, 'circuit_rooms', 'circuit_id', circuit(c.id), c.roomIds.map(room));
		}
		for (const p of doc.panels) {
			if (p.fedFromCircuitId) {
				await trx('panels')
					.where({ id: panel(p.id) })
					.update({ fed_from_circuit_id: circuit(p.fedFromCircuitId) });
			}
		}
		for (const l of doc.loads) {
			const loadId = randomUUID();
			await trx('loads').insert({ id: loadId, circuit_id: circuit(l.circuitId), ...loadToRow(l) });
			await setRoomLinks(trx, 'load_rooms', 'load_id', loadId, l.roomIds.map(room));
		}
		const counts = {
			rooms: doc.rooms.length,
			panels: doc.panels.length,
			circuits: doc.circuits.length,
			loads: doc.loads.length,
		};
		await recordAudit(trx, {
			jobId,
			userId: actor.id,
			entity: 'job',
			entityId: jobId,
			action: 'import',
			before: null,
			after: { counts, document: doc },
		});
		return { job: (await getJob(trx, jobId))!, counts };
	});
}

import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { DEMO_JOB_DOCUMENT } from '../../seeds/data/demo-job';
import { testDb } from '../helpers/db';
import { HttpClient, signedInAs } from '../helpers/http';
import {
	call,
	circuitAt,
	loadOf,
	mainPanel,
	newJob,
	otherFirmOwner,
	removeJobs,
	type ErrorBody,
	removeOtherFirm,
} from '../helpers/jobs';

const db = testDb();
const created: string[] = [];
let owner: HttpClient;
let homeowner: HttpClient;
let other: Awaited<ReturnType<typeof otherFirmOwner>>;

beforeAll(async () => {
	[owner, homeowner] = await Promise.all([signedInAs('owner'), signedInAs('homeowner')]);
	other = await otherFirmOwner();
});

afterAll(async () => {
	await removeJobs(db, created);
	await removeOtherFirm(db, other);
	await db.destroy();
});

type Load = { id: string; version: number; description: string; va: number | null; [k: string]: unknown };

/** The load as the save endpoint takes it: the whole load with its id and version. */
const asItem = ({ circuitId: _c, jobId: _j, ...rest }: Load) => rest;

/**
 * A fresh job with a kitchen and a 20-space main panel, and a 20 A kitchen circuit added together
 * with two loads through POST /api/panels/[id]/circuits.
 */
async function fixture() {
	const job = (await call(owner, 'POST', '/api/jobs', newJob())).body.job;
	created.push(job.id);
	const room = (
		await call(owner, 'POST', `/api/jobs/${job.id}/rooms`, { name: 'Kitchen', type: 'kitchen', areaFt2: 200 })
	).body.room;
	const panel = (await call(owner, 'POST', `/api/jobs/${job.id}/panels`, mainPanel())).body.panel;
	const res = await call(owner, 'POST', `/api/panels/${panel.id}/circuits`, {
		...circuitAt(1, { roomIds: [room.id], breakerType: 'dual-function', label: 'Kitchen counter' }),
		loads: [
			loadOf({ description: 'Counter receptacles', roomIds: [room.id] }),
			loadOf({ kind: 'fixed-appliance', description: 'Disposal', quantity: 1, va: 600 }),
		],
	});
	expect(res.status).toBe(201);
	const { circuit, loads } = res.body as { circuit: { id: string; version: number }; loads: Load[] };
	return { job, room, panel, circuit, loads };
}

/** Everything of one job that a save could change, to assert that a refused save wrote nothing. */
async function snapshot(jobId: string) {
	const circuits = await db('circuits as c')
		.join('panels as p', 'p.id', 'c.panel_id')
		.where('p.job_id', jobId)
		.orderBy('c.id')
		.select('c.*');
	const ids = circuits.map((c) => c.id);
	const loads = await db('loads').whereIn('circuit_id', ids).orderBy('id');
	const loadRooms = await db('load_rooms')
		.whereIn(
			'load_id',
			loads.map((l) => l.id),
		)
		.orderBy(['load_id', 'ordinal']);
	const circuitRooms = await db('circuit_rooms')
		.whereIn('circuit_id', ids)
		.orderBy(['circuit_id', 'ordinal']);
	const audit = await db('audit_log').where({ job_id: jobId }).count<{ count: string }[]>('* as count');
	return { circuits, loads, loadRooms, circuitRooms, audit: Number(audit[0]!.count) };
}

const auditOf = async (entityId: string) =>
	(await db('audit_log').where({ entity_id: entityId }).orderBy('id').pluck('action')) as string[];

describe('adding a breaker with its loads', () => {
	test('writes the circuit and every load in one request, with an audit row each', async () => {
		const { circuit, loads, room } = await fixture();
		expect(circuit).toMatchObject({ position: 1, label: 'Kitchen counter', version: 1 });
		expect(loads.map((l) => [l.description, l.va, l.version])).toEqual([
			['Counter receptacles', 180, 1],
			['Disposal', 600, 1],
		]);
		expect(loads[0]!.roomIds).toEqual([room.id]);
		expect(await db('loads').where({ circuit_id: circuit.id }).count<{ count: string }[]>('* as n')).toEqual([
			{ n: '2' },
		]);
		expect(await auditOf(circuit.id)).toEqual(['create']);
		for (const l of loads) expect(await auditOf(l.id)).toEqual(['create']);
	});

	test('refuses a bad load in the batch with its path and adds neither the breaker nor any load', async () => {
		const { job, panel } = await fixture();
		const before = await snapshot(job.id);
		const res = await call<ErrorBody>(owner, 'POST', `/api/panels/${panel.id}/circuits`, {
			...circuitAt(3),
			loads: [loadOf(), loadOf({ kind: 'dryer', va: 5000, voltage: 240 })],
		});
		// A 1-pole breaker in a 120/240 V panel supplies 120 V only (NEC 210.19, 220.5: a 240 V load needs both legs).
		expect(res.status).toBe(400);
		expect(res.body.error.fields?.['loads.1.voltage']?.join(' ')).toMatch(/240 V load cannot be supplied/);
		expect(await snapshot(job.id)).toEqual(before);
	});
});

describe('saving a circuit with its loads (PUT /api/circuits/[id]/with-loads)', () => {
	test('changes the circuit, updates, adds and deletes loads in one go, leaving unchanged loads alone', async () => {
		const { circuit, loads } = await fixture();
		const [counter, disposal] = loads as [Load, Load];
		const third = (
			await call(
				owner,
				'POST',
				`/api/circuits/${circuit.id}/loads`,
				loadOf({ description: 'Island', va: 360 }),
			)
		).body.load as Load;
		const res = await call(owner, 'PUT', `/api/circuits/${circuit.id}/with-loads`, {
			version: circuit.version,
			label: 'Kitchen counter, east',
			lengthFt: 55,
			loads: [
				{ ...asItem(counter), va: 200 },
				asItem(third),
				loadOf({ kind: 'small-appliance', description: 'Coffee maker', quantity: 1, va: 1200 }),
			],
			deleteLoads: [{ id: disposal.id, version: disposal.version }],
		});
		expect(res.status).toBe(200);
		expect(res.body.circuit).toMatchObject({ label: 'Kitchen counter, east', lengthFt: 55, version: 2 });
		expect(res.body.loads.map((l: Load) => [l.description, l.va, l.version])).toEqual([
			['Counter receptacles', 200, 2],
			['Island', 360, 1],
			['Coffee maker', 1200, 1],
		]);
		const inDb = await db('loads')
			.where({ circuit_id: circuit.id })
			.orderBy('seq')
			.select('description', 'va');
		expect(inDb.map((l) => [l.description, Number(l.va)])).toEqual([
			['Counter receptacles', 200],
			['Island', 360],
			['Coffee maker', 1200],
		]);
		expect(await auditOf(circuit.id)).toEqual(['create', 'update']);
		expect(await auditOf(counter.id)).toEqual(['create', 'update']);
		expect(await auditOf(disposal.id)).toEqual(['create', 'delete']);
		expect(await auditOf(third.id)).toEqual(['create']);
		const coffee = res.body.loads[2] as Load;
		expect(await auditOf(coffee.id)).toEqual(['create']);
	});

	test('leaves the circuit at its version when only a load changes', async () => {
		const { circuit, loads } = await fixture();
		const res = await call(owner, 'PUT', `/api/circuits/${circuit.id}/with-loads`, {
			version: circuit.version,
			loads: [asItem(loads[0]!), { ...asItem(loads[1]!), quantity: 2 }],
		});
		expect(res.status).toBe(200);
		expect(res.body.circuit.version).toBe(1);
		expect(res.body.loads.map((l: Load) => l.version)).toEqual([1, 2]);
		expect(await auditOf(circuit.id)).toEqual(['create']);
	});

	test.each([
		[
			'a load with no rating',
			() => ({ kind: 'lighting', quantity: 1, voltage: 120 }),
			'loads.1.va',
			/give the rating/,
		],
		['a load of quantity 0', () => loadOf({ quantity: 0 }), 'loads.1.quantity', /./],
		[
			'a 240 V load on a 1-pole circuit',
			() => loadOf({ kind: 'dryer', va: 5000, voltage: 240 }),
			'loads.1.voltage',
			/240 V load cannot be supplied/,
		],
		[
			'a room of another job',
			() => loadOf({ roomIds: ['00000000-0000-4000-8000-000000000000'] }),
			'loads.1.roomIds.0',
			/no room of this job/,
		],
	])('refuses %s with the path and writes nothing', async (_what, bad, field, message) => {
		const { job, circuit, loads } = await fixture();
		const before = await snapshot(job.id);
		const res = await call<ErrorBody>(owner, 'PUT', `/api/circuits/${circuit.id}/with-loads`, {
			version: circuit.version,
			label: 'Renamed in a refused save',
			loads: [{ ...asItem(loads[0]!), va: 999 }, bad(), loadOf({ description: 'Would be new' })],
			deleteLoads: [{ id: loads[1]!.id, version: loads[1]!.version }],
		});
		expect(res.status).toBe(400);
		expect(res.body.error.code).toBe('validation');
		expect(res.body.error.fields?.[field]?.join(' ')).toMatch(message);
		expect(await snapshot(job.id)).toEqual(before);
		expect((await db('circuits').where({ id: circuit.id }).first()).label).toBe('Kitchen counter');
	});

	test('refuses a bad circuit field with its path and writes nothing', async () => {
		const { job, circuit, loads } = await fixture();
		const before = await snapshot(job.id);
		const res = await call<ErrorBody>(owner, 'PUT', `/api/circuits/${circuit.id}/with-loads`, {
			version: circuit.version,
			ratingA: 17,
			loads: loads.map(asItem),
		});
		// 17 A is not a standard rating (NEC 240.6(A) lists 15, 20, 25, ...).
		expect(res.status).toBe(400);
		expect(res.body.error.fields?.ratingA?.join(' ')).toMatch(/240\.6/);
		expect(await snapshot(job.id)).toEqual(before);
	});

	test.each([
		['the circuit is stale', 'circuit'],
		['a load is stale', 'load'],
		['a load was added by someone else', 'added'],
		['a load was deleted by someone else', 'deleted'],
	])('answers 409 with the current circuit and loads when %s, and writes nothing', async (_what, how) => {
		const { job, circuit, loads } = await fixture();
		if (how === 'circuit')
			await call(owner, 'PATCH', `/api/circuits/${circuit.id}`, { version: 1, label: 'Changed meanwhile' });
		if (how === 'load')
			await call(owner, 'PATCH', `/api/loads/${loads[0]!.id}`, {
				version: 1,
				description: 'Changed meanwhile',
			});
		if (how === 'added')
			await call(
				owner,
				'POST',
				`/api/circuits/${circuit.id}/loads`,
				loadOf({ description: 'Added meanwhile' }),
			);
		if (how === 'deleted') await call(owner, 'DELETE', `/api/loads/${loads[1]!.id}`, { version: 1 });
		const before = await snapshot(job.id);
		const res = await call<ErrorBody>(owner, 'PUT', `/api/circuits/${circuit.id}/with-loads`, {
			version: 1,
			label: 'My label',
			loads: [{ ...asItem(loads[0]!), va: 240 }, asItem(loads[1]!), loadOf({ description: 'Mine' })],
		});
		expect(res.status).toBe(409);
		expect(res.body.error.code).toBe('conflict');
		const current = res.body.error.current as { circuit: { id: string; label: string }; loads: Load[] };
		expect(current.circuit.id).toBe(circuit.id);
		expect(current.circuit.label).toBe(how === 'circuit' ? 'Changed meanwhile' : 'Kitchen counter');
		const descriptions = current.loads.map((l) => l.description);
		if (how === 'load') expect(descriptions).toContain('Changed meanwhile');
		if (how === 'added') expect(descriptions).toContain('Added meanwhile');
		if (how === 'deleted') expect(descriptions).not.toContain('Disposal');
		expect(await snapshot(job.id)).toEqual(before);
	});

	test('refuses homeowners (403), other firms (404) and the signed out (401), writing nothing', async () => {
		const demoJob = await db('jobs').where({ name: DEMO_JOB_DOCUMENT.name }).first('id');
		const demoCircuit = await db('circuits as c')
			.join('panels as p', 'p.id', 'c.panel_id')
			.where('p.job_id', demoJob.id)
			.first('c.id', 'c.version', 'c.label');
		const before = await snapshot(demoJob.id);
		const body = { version: demoCircuit.version, label: 'Not theirs to change', loads: [] };
		const path = `/api/circuits/${demoCircuit.id}/with-loads`;
		const asHomeowner = await call<ErrorBody>(homeowner, 'PUT', path, body);
		expect(asHomeowner.status).toBe(403);
		const asOtherFirm = await call<ErrorBody>(other.client, 'PUT', path, body);
		expect(asOtherFirm.status).toBe(404);
		expect(asOtherFirm.body.error.code).toBe('not_found');
		expect((await call(new HttpClient(), 'PUT', path, body)).status).toBe(401);
		const demoPanel = await db('panels').where({ job_id: demoJob.id }).first('id');
		const addAsOther = await call(other.client, 'POST', `/api/panels/${demoPanel.id}/circuits`, {
			...circuitAt(41),
			loads: [loadOf()],
		});
		expect(addAsOther.status).toBe(404);
		expect(await snapshot(demoJob.id)).toEqual(before);
	});

	test('answers 404 for an unknown circuit', async () => {
		const res = await call(owner, 'PUT', '/api/circuits/00000000-0000-4000-8000-000000000000/with-loads', {
			version: 1,
			loads: [],
		});
		expect(res.status).toBe(404);
	});
});

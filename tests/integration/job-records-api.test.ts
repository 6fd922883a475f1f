import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { DEMO_JOB_DOCUMENT } from '../../seeds/data/demo-job';
import { testDb } from '../helpers/db';
import { HttpClient, signedInAs } from '../helpers/http';
import {
	call,
	circuitAt,
	jobTableCounts,
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
let demoJobId: string;

beforeAll(async () => {
	[owner, homeowner] = await Promise.all([signedInAs('owner'), signedInAs('homeowner')]);
	other = await otherFirmOwner();
	demoJobId = (await db('jobs').where({ name: DEMO_JOB_DOCUMENT.name }).first('id')).id;
});

afterAll(async () => {
	await removeJobs(db, created);
	await removeOtherFirm(db, other);
	await db.destroy();
});

/** A fresh job with a kitchen, a 20-space main panel and one 20 A kitchen circuit carrying one load. */
async function fixture() {
	const job = (await call(owner, 'POST', '/api/jobs', newJob())).body.job;
	created.push(job.id);
	const room = (
		await call(owner, 'POST', `/api/jobs/${job.id}/rooms`, { name: 'Kitchen', type: 'kitchen', areaFt2: 200 })
	).body.room;
	const panel = (await call(owner, 'POST', `/api/jobs/${job.id}/panels`, mainPanel())).body.panel;
	const circuit = (
		await call(
			owner,
			'POST',
			`/api/panels/${panel.id}/circuits`,
			circuitAt(1, { roomIds: [room.id], breakerType: 'dual-function' }),
		)
	).body.circuit;
	const load = (
		await call(owner, 'POST', `/api/circuits/${circuit.id}/loads`, loadOf({ roomIds: [room.id] }))
	).body.load;
	return { job, room, panel, circuit, load };
}

const auditActions = async (entityId: string) =>
	(await db('audit_log').where({ entity_id: entityId }).orderBy('id').pluck('action')) as string[];

describe('rooms', () => {
	test('are created, listed, changed and deleted, each with an audit row', async () => {
		const { job, room, circuit } = await fixture();
		expect(room).toMatchObject({
			name: 'Kitchen',
			type: 'kitchen',
			floor: 1,
			areaFt2: 200,
			inFloorArea: null,
			version: 1,
		});
		expect((await call(homeowner, 'GET', `/api/jobs/${job.id}/rooms`)).status).toBe(404);
		expect((await call(owner, 'GET', `/api/jobs/${job.id}/rooms`)).body.items).toHaveLength(1);
		const changed = await call(owner, 'PATCH', `/api/rooms/${room.id}`, { version: 1, areaFt2: 240 });
		expect(changed.body.room).toMatchObject({ areaFt2: 240, name: 'Kitchen', version: 2 });
		expect((await call(owner, 'DELETE', `/api/rooms/${room.id}`, { version: 2 })).status).toBe(200);
		expect(await auditActions(room.id)).toEqual(['create', 'update', 'delete']);
		const tree = await call(owner, 'GET', `/api/jobs/${job.id}/tree`);
		expect(tree.body.circuits.find((c: { id: string }) => c.id === circuit.id).roomIds).toEqual([]);
	});

	test.each([
		['no type', { name: 'Den', areaFt2: 100 }, 'type', /required/],
		['an unknown type', { name: 'Den', type: 'den', areaFt2: 100 }, 'type', /not a room type/],
		['a negative area', { name: 'Den', type: 'living', areaFt2: -1 }, 'areaFt2', /0 ft² or more/],
		['a fractional floor', { name: 'Den', type: 'living', areaFt2: 10, floor: 1.5 }, 'floor', /whole storey/],
		[
			'an emptied area',
			{ name: 'Den', type: 'living', areaFt2: null },
			'areaFt2',
			/^Enter the floor area in square feet\.$/,
		],
		['no area', { name: 'Den', type: 'living' }, 'areaFt2', /^Enter the floor area in square feet\.$/],
	])('refuses a room with %s and writes nothing', async (_what, body, field, message) => {
		const before = await jobTableCounts(db);
		const res = await call<ErrorBody>(owner, 'POST', `/api/jobs/${demoJobId}/rooms`, body);
		expect(res.status).toBe(400);
		expect(res.body.error.fields?.[field]?.join(' ')).toMatch(message);
		expect(await jobTableCounts(db)).toEqual(before);
	});

	test('refuses a stale version with the current room, and strangers and homeowners', async () => {
		const { room } = await fixture();
		await call(owner, 'PATCH', `/api/rooms/${room.id}`, { version: 1, name: 'Kitchen and nook' });
		const stale = await call<ErrorBody>(owner, 'PATCH', `/api/rooms/${room.id}`, {
			version: 1,
			name: 'Galley',
		});
		expect(stale.status).toBe(409);
		expect(stale.body.error.current).toMatchObject({ name: 'Kitchen and nook', version: 2 });
		expect((await call(owner, 'DELETE', `/api/rooms/${room.id}`, { version: 1 })).status).toBe(409);
		expect(
			(await call(other.client, 'PATCH', `/api/rooms/${room.id}`, { version: 2, name: 'x' })).status,
		).toBe(404);
		expect(
			(await call(new HttpClient(), 'PATCH', `/api/rooms/${room.id}`, { version: 2, name: 'x' })).status,
		).toBe(401);
		expect(
			(await call(owner, 'PATCH', '/api/rooms/00000000-0000-4000-8000-000000000000', { version: 1 })).status,
		).toBe(404);
		const demoRoom = await db('rooms').where({ job_id: demoJobId }).first('id', 'version');
		expect(
			(await call(homeowner, 'PATCH', `/api/rooms/${demoRoom.id}`, { version: demoRoom.version, name: 'x' }))
				.status,
		).toBe(403);
		expect((await db('rooms').where({ id: room.id }).first()).name).toBe('Kitchen and nook');
	});
});

describe('panels', () => {
	test('are created and read with their circuits and loads by anyone who may read the job', async () => {
		const { panel, circuit, load } = await fixture();
		expect(panel).toMatchObject({
			kind: 'main',
			spaces: 20,
			mainBreakerA: 200,
			fedFromCircuitId: null,
			version: 1,
		});
		const res = await call(owner, 'GET', `/api/panels/${panel.id}`);
		expect(res.body.circuits.map((c: { id: string }) => c.id)).toEqual([circuit.id]);
		expect(res.body.loads.map((l: { id: string }) => l.id)).toEqual([load.id]);
		const demoPanel = await db('panels').where({ job_id: demoJobId }).first('id');
		expect((await call(homeowner, 'GET', `/api/panels/${demoPanel.id}`)).status).toBe(200);
		expect((await call(other.client, 'GET', `/api/panels/${demoPanel.id}`)).status).toBe(404);
		expect((await call(owner, 'GET', `/api/jobs/${demoJobId}/panels`)).body.items).toHaveLength(2);
	});

	test('a subpanel is fed from a 2-pole circuit of another panel', async () => {
		const { job, panel } = await fixture();
		const feeder = (
			await call(
				owner,
				'POST',
				`/api/panels/${panel.id}/circuits`,
				circuitAt(3, {
					poles: 2,
					ratingA: 60,
					breakerType: 'standard',
					conductor: { size: '6', material: 'cu', insulationC: 90 },
				}),
			)
		).body.circuit;
		const sub = await call(
			owner,
			'POST',
			`/api/jobs/${job.id}/panels`,
			mainPanel({
				name: 'Garage',
				kind: 'sub',
				fedFromCircuitId: feeder.id,
				mainBreakerA: null,
				busRatingA: 125,
			}),
		);
		expect(sub.status).toBe(201);
		const tree = await call(owner, 'GET', `/api/jobs/${job.id}/tree`);
		expect(tree.body.engine.ok).toBe(true);
		const result = tree.body.engine.results.circuits.find(
			(c: { circuitId: string }) => c.circuitId === feeder.id,
		);
		expect(result.feedsPanelId).toBe(sub.body.panel.id);
		// The feeder cannot go while it feeds the subpanel, nor can the panel holding it.
		expect(
			(await call<ErrorBody>(owner, 'DELETE', `/api/circuits/${feeder.id}`, { version: 1 })).status,
		).toBe(409);
		const delMain = await call<ErrorBody>(owner, 'DELETE', `/api/panels/${panel.id}`, { version: 1 });
		expect(delMain.status).toBe(409);
		expect(delMain.body.error.message).toMatch(/Garage/);
	});

	test.each([
		['a subpanel without a feeder', { kind: 'sub' }, 'fedFromCircuitId', /choose the circuit/],
		[
			'a main panel with a feeder',
			{ fedFromCircuitId: '00000000-0000-4000-8000-000000000000' },
			'fedFromCircuitId',
			/supplied by the service/,
		],
		[
			'a feeder that is no circuit of the job',
			{ kind: 'sub', fedFromCircuitId: '00000000-0000-4000-8000-000000000000' },
			'fedFromCircuitId',
			/no circuit of this job/,
		],
		['too few spaces', { spaces: 1 }, 'spaces', /at least 2/],
		['a non-standard main breaker', { mainBreakerA: 55 }, 'mainBreakerA', /240\.6\(A\)/],
		['no name', { name: '' }, 'name', /must not be empty/],
	])('refuses %s and writes nothing', async (_what, change, field, message) => {
		const before = await jobTableCounts(db);
		const res = await call<ErrorBody>(owner, 'POST', `/api/jobs/${demoJobId}/panels`, mainPanel(change));
		expect(res.status).toBe(400);
		expect(res.body.error.fields?.[field]?.join(' ')).toMatch(message);
		expect(await jobTableCounts(db)).toEqual(before);
	});

	test('refuses a 1-pole feeder through the engine’s own check, naming the field', async () => {
		const { job, circuit } = await fixture();
		const before = await jobTableCounts(db);
		const res = await call<ErrorBody>(
			owner,
			'POST',
			`/api/jobs/${job.id}/panels`,
			mainPanel({ kind: 'sub', fedFromCircuitId: circuit.id }),
		);
		expect(res.status).toBe(400);
		expect(res.body.error.fields?.fedFromCircuitId?.join(' ')).toMatch(/1-pole/);
		expect(await jobTableCounts(db)).toEqual(before);
	});

	test('will not shrink below the breakers it holds', async () => {
		const { panel } = await fixture();
		await call(owner, 'POST', `/api/panels/${panel.id}/circuits`, circuitAt(18));
		const res = await call<ErrorBody>(owner, 'PATCH', `/api/panels/${panel.id}`, { version: 1, spaces: 16 });
		expect(res.status).toBe(400);
		expect(res.body.error.fields?.spaces?.join(' ')).toMatch(/position 18/);
		expect((await db('panels').where({ id: panel.id }).first()).spaces).toBe(20);
		const ok = await call(owner, 'PATCH', `/api/panels/${panel.id}`, {
			version: 1,
			spaces: 18,
			location: 'Hall closet',
		});
		expect(ok.body.panel).toMatchObject({ spaces: 18, location: 'Hall closet', version: 2 });
		const stale = await call<ErrorBody>(owner, 'PATCH', `/api/panels/${panel.id}`, {
			version: 1,
			spaces: 24,
		});
		expect(stale.status).toBe(409);
		expect(stale.body.error.current).toMatchObject({ spaces: 18 });
	});

	test('deleting a panel deletes its circuits and loads in one go, an audit row each', async () => {
		const { job, panel, circuit, load } = await fixture();
		const res = await call(owner, 'DELETE', `/api/panels/${panel.id}`, { version: 1 });
		expect(res.body).toEqual({ deleted: true, circuits: 1, loads: 1 });
		expect(await db('circuits').where({ id: circuit.id })).toEqual([]);
		expect(await db('loads').where({ id: load.id })).toEqual([]);
		for (const id of [panel.id, circuit.id, load.id])
			expect(await auditActions(id)).toEqual(['create', 'delete']);
		expect((await call(owner, 'GET', `/api/jobs/${job.id}/panels`)).body.items).toEqual([]);
	});

	test('refuses a homeowner’s write with 403', async () => {
		const demoPanel = await db('panels').where({ job_id: demoJobId }).first('id', 'version');
		expect(
			(
				await call(homeowner, 'PATCH', `/api/panels/${demoPanel.id}`, {
					version: demoPanel.version,
					name: 'x',
				})
			).status,
		).toBe(403);
		expect(
			(await call(homeowner, 'DELETE', `/api/panels/${demoPanel.id}`, { version: demoPanel.version })).status,
		).toBe(403);
		expect((await call(homeowner, 'POST', `/api/jobs/${demoJobId}/panels`, mainPanel())).status).toBe(403);
	});

	test('exports its circuits as CSV', async () => {
		const { panel, room } = await fixture();
		await call(
			owner,
			'POST',
			`/api/panels/${panel.id}/circuits`,
			circuitAt(2, {
				poles: 2,
				ratingA: 30,
				breakerType: 'standard',
				label: 'Dryer, "laundry"',
				conductor: { size: '10', material: 'cu', insulationC: 90 },
				roomIds: [room.id],
			}),
		);
		const res = await owner.fetch(`/api/panels/${panel.id}/circuits.csv`);
		expect(res.headers.get('content-type')).toMatch(/text\/csv/);
		const lines = (await res.text()).trim().split('\n');
		expect(lines[0]).toBe('Position,Poles,Rating A,Breaker,Label,Conductor,Length ft,Status,Rooms,Load VA');
		// 4 receptacles × 180 VA = 720 VA (NEC 220.14(I) figure, as entered on the load).
		expect(lines[1]).toBe('1,1,20,AFCI/GFCI dual-function,Circuit 1,12 AWG Cu 90 °C,40,new,Kitchen,720');
		expect(lines[2]).toBe('2/4,2,30,Standard,"Dryer, ""laundry""",10 AWG Cu 90 °C,40,new,Kitchen,0');
		expect((await other.client.fetch(`/api/panels/${panel.id}/circuits.csv`)).status).toBe(404);
	});
});

describe('circuits', () => {
	test('are created with their rooms, changed, and deleted with their loads', async () => {
		const { circuit, room, load } = await fixture();
		expect(circuit).toMatchObject({
			position: 1,
			poles: 1,
			ratingA: 20,
			status: 'new',
			roomIds: [room.id],
			version: 1,
		});
		const changed = await call(owner, 'PATCH', `/api/circuits/${circuit.id}`, {
			version: 1,
			label: 'Counter left',
			ratingA: 15,
			conductor: { size: '14', material: 'cu', insulationC: 90 },
		});
		expect(changed.body.circuit).toMatchObject({
			label: 'Counter left',
			ratingA: 15,
			roomIds: [room.id],
			version: 2,
		});
		const del = await call(owner, 'DELETE', `/api/circuits/${circuit.id}`, { version: 2 });
		expect(del.body).toEqual({ deleted: true, loads: 1 });
		expect(await auditActions(circuit.id)).toEqual(['create', 'update', 'delete']);
		expect(await auditActions(load.id)).toEqual(['create', 'delete']);
	});

	test.each([
		['a non-standard rating', { ratingA: 17 }, 'ratingA', /240\.6\(A\)/],
		['position 0', { position: 0 }, 'position', /1 or more/],
		['four poles', { poles: 4 }, 'poles', /1, 2 or 3/],
		[
			'an unknown conductor size',
			{ conductor: { size: '7', material: 'cu', insulationC: 90 } },
			'conductor.size',
			/not a conductor size/,
		],
		['an unknown breaker type', { breakerType: 'magic' }, 'breakerType', /not a breaker type/],
		['a room id that is no UUID', { roomIds: ['kitchen'] }, 'roomIds.0', /UUID/],
		[
			'a room of no job',
			{ roomIds: ['00000000-0000-4000-8000-000000000000'] },
			'roomIds.0',
			/no room of this job/,
		],
		['a taken position', { position: 1 }, 'position', /taken by “Circuit 1”/],
		['a position beyond the spaces', { position: 21 }, 'position', /beyond the panel’s 20 spaces/],
		['a 2-pole breaker running past the last space', { position: 19, poles: 2 }, 'position', /19 and 21/],
		[
			'a 2-pole breaker on a taken position',
			{ position: 3, poles: 2, ratingA: 30 },
			'position',
			/position 5 is taken by “Blocker”/,
		],
		['a 3-pole breaker in a single-phase panel', { position: 7, poles: 3 }, 'poles', /three-phase/],
	])('refuses %s and writes nothing', async (_what, change, field, message) => {
		const { panel } = await fixture();
		await call(owner, 'POST', `/api/panels/${panel.id}/circuits`, circuitAt(5, { label: 'Blocker' }));
		const before = await jobTableCounts(db);
		const body = { ...circuitAt(3), ...change };
		const res = await call<ErrorBody>(owner, 'POST', `/api/panels/${panel.id}/circuits`, body);
		expect([400, 409]).toContain(res.status);
		expect(res.body.error.fields?.[field]?.join(' ')).toMatch(message);
		expect(await jobTableCounts(db)).toEqual(before);
	});

	test('a breaker moves to a free position, and is refused a taken one or one beyond the spaces', async () => {
		const { panel, circuit } = await fixture();
		const other2 = (
			await call(
				owner,
				'POST',
				`/api/panels/${panel.id}/circuits`,
				circuitAt(4, { poles: 2, ratingA: 30, label: 'Dryer' }),
			)
		).body.circuit;
		const taken = await call<ErrorBody>(owner, 'POST', `/api/circuits/${circuit.id}/move`, {
			position: 6,
			version: 1,
		});
		expect(taken.status).toBe(409);
		expect(taken.body.error.message).toMatch(/Position 6 .* taken by “Dryer”/);
		const beyond = await call<ErrorBody>(owner, 'POST', `/api/circuits/${other2.id}/move`, {
			position: 20,
			version: 1,
		});
		expect(beyond.status).toBe(400);
		expect(beyond.body.error.fields?.position?.join(' ')).toMatch(/positions 20 and 22/);
		const moved = await call(owner, 'POST', `/api/circuits/${circuit.id}/move`, { position: 7, version: 1 });
		expect(moved.status).toBe(200);
		expect(moved.body.circuit).toMatchObject({ position: 7, version: 2 });
		const stale = await call<ErrorBody>(owner, 'POST', `/api/circuits/${circuit.id}/move`, {
			position: 9,
			version: 1,
		});
		expect(stale.status).toBe(409);
		expect(stale.body.error.current).toMatchObject({ position: 7 });
		expect(await auditActions(circuit.id)).toEqual(['create', 'move']);
		expect((await db('circuits').where({ id: circuit.id }).first()).position).toBe(7);
	});

	test('a change that would put a 240 V load on a 1-pole circuit is refused by the engine’s check', async () => {
		const { panel } = await fixture();
		const dryer = (
			await call(owner, 'POST', `/api/panels/${panel.id}/circuits`, circuitAt(4, { poles: 2, ratingA: 30 }))
		).body.circuit;
		await call(
			owner,
			'POST',
			`/api/circuits/${dryer.id}/loads`,
			loadOf({ kind: 'dryer', quantity: 1, va: null, watts: 5000, voltage: 240 }),
		);
		const res = await call<ErrorBody>(owner, 'PATCH', `/api/circuits/${dryer.id}`, { version: 1, poles: 1 });
		expect(res.status).toBe(400);
		expect(res.body.error.fields?._?.join(' ')).toMatch(/240 V load cannot be supplied/);
		expect((await db('circuits').where({ id: dryer.id }).first()).poles).toBe(2);
	});

	test('refuses strangers, the signed-out and homeowners', async () => {
		const demo = await db('circuits as c')
			.join('panels as p', 'p.id', 'c.panel_id')
			.where('p.job_id', demoJobId)
			.first('c.id', 'c.version', 'c.panel_id');
		expect(
			(await call(homeowner, 'PATCH', `/api/circuits/${demo.id}`, { version: demo.version, label: 'x' }))
				.status,
		).toBe(403);
		expect(
			(
				await call(homeowner, 'POST', `/api/circuits/${demo.id}/move`, {
					version: demo.version,
					position: 39,
				})
			).status,
		).toBe(403);
		expect(
			(await call(homeowner, 'POST', `/api/panels/${demo.panel_id}/circuits`, circuitAt(39))).status,
		).toBe(403);
		expect(
			(await call(other.client, 'DELETE', `/api/circuits/${demo.id}`, { version: demo.version })).status,
		).toBe(404);
		expect(
			(await call(new HttpClient(), 'DELETE', `/api/circuits/${demo.id}`, { version: demo.version })).status,
		).toBe(401);
		expect((await db('circuits').where({ id: demo.id }).first()).version).toBe(demo.version);
	});
});

describe('loads', () => {
	test('are created with their rooms, changed and deleted', async () => {
		const { circuit, room } = await fixture();
		const created2 = await call(
			owner,
			'POST',
			`/api/circuits/${circuit.id}/loads`,
			loadOf({
				kind: 'lighting',
				quantity: 8,
				va: null,
				watts: 12,
				roomIds: [room.id],
				description: 'Recessed fixtures',
			}),
		);
		expect(created2.status).toBe(201);
		const load = created2.body.load;
		expect(load).toMatchObject({
			watts: 12,
			va: null,
			quantity: 8,
			roomIds: [room.id],
			continuous: false,
			version: 1,
		});
		const changed = await call(owner, 'PATCH', `/api/loads/${load.id}`, {
			version: 1,
			watts: null,
			va: 15,
			continuous: true,
		});
		expect(changed.body.load).toMatchObject({ watts: null, va: 15, continuous: true, version: 2 });
		expect((await call(owner, 'DELETE', `/api/loads/${load.id}`, { version: 2 })).status).toBe(200);
		expect(await auditActions(load.id)).toEqual(['create', 'update', 'delete']);
	});

	test.each([
		['no rating', { va: undefined }, 'va', /give the rating/],
		['two ratings', { watts: 100 }, '_', /only one of va, watts or hp/],
		['an unknown kind', { kind: 'toaster' }, 'kind', /not a load kind/],
		['quantity 0', { quantity: 0 }, 'quantity', /1 or more/],
		['an unknown voltage', { voltage: 230 }, 'voltage', /120, 208 or 240/],
		['a horsepower not in Table 430.248', { va: undefined, hp: '4' }, 'hp', /430\.248/],
		[
			'space heating on a lighting load',
			{ kind: 'lighting', spaceHeating: 'central' },
			'spaceHeating',
			/hvac-heat/,
		],
		['a 240 V load on a 120 V circuit', { voltage: 240 }, 'voltage', /cannot be supplied/],
	])('refuses a load with %s and writes nothing', async (_what, change, field, message) => {
		const { circuit } = await fixture();
		const before = await jobTableCounts(db);
		const res = await call<ErrorBody>(owner, 'POST', `/api/circuits/${circuit.id}/loads`, {
			...loadOf(),
			...change,
		});
		expect(res.status).toBe(400);
		expect(res.body.error.fields?.[field]?.join(' ')).toMatch(message);
		expect(await jobTableCounts(db)).toEqual(before);
	});

	test('a change that leaves two ratings is refused, and a stale version returns the current load', async () => {
		const { load } = await fixture();
		const both = await call<ErrorBody>(owner, 'PATCH', `/api/loads/${load.id}`, { version: 1, watts: 100 });
		expect(both.status).toBe(400);
		expect(both.body.error.fields?._?.join(' ')).toMatch(/only one/);
		await call(owner, 'PATCH', `/api/loads/${load.id}`, { version: 1, quantity: 6 });
		const stale = await call<ErrorBody>(owner, 'PATCH', `/api/loads/${load.id}`, { version: 1, quantity: 2 });
		expect(stale.status).toBe(409);
		expect(stale.body.error.current).toMatchObject({ quantity: 6, version: 2 });
		expect((await db('loads').where({ id: load.id }).first()).quantity).toBe(6);
	});

	test('refuses strangers and homeowners', async () => {
		const demo = await db('loads as l')
			.join('circuits as c', 'c.id', 'l.circuit_id')
			.join('panels as p', 'p.id', 'c.panel_id')
			.where('p.job_id', demoJobId)
			.first('l.id', 'l.version', 'l.circuit_id');
		expect(
			(await call(homeowner, 'PATCH', `/api/loads/${demo.id}`, { version: demo.version, quantity: 3 }))
				.status,
		).toBe(403);
		expect((await call(homeowner, 'POST', `/api/circuits/${demo.circuit_id}/loads`, loadOf())).status).toBe(
			403,
		);
		expect(
			(await call(other.client, 'PATCH', `/api/loads/${demo.id}`, { version: demo.version, quantity: 3 }))
				.status,
		).toBe(404);
		expect(
			(await call(new HttpClient(), 'DELETE', `/api/loads/${demo.id}`, { version: demo.version })).status,
		).toBe(401);
		expect((await db('loads').where({ id: demo.id }).first()).version).toBe(demo.version);
	});
});

import { describe, expect, test } from 'vitest';
import { parseJobDocument } from '../../../src/lib/electrical/index';
import { circuit, job, load } from './job-builder';

type Doc = Record<string, unknown>;
const base = (): Doc =>
	job({
		rooms: [{ id: 'r1', name: 'Kitchen', type: 'kitchen', areaFt2: 100 }],
		circuits: [circuit({ id: 'c1', position: 1 }), circuit({ id: 'c2', position: 3 })],
		loads: [load({ circuitId: 'c1', kind: 'lighting', va: 100 })],
	}) as Doc;

function edit(fn: (d: Doc & { circuits: Doc[]; loads: Doc[]; panels: Doc[]; rooms: Doc[] }) => void): Doc {
	const d = structuredClone(base()) as Doc & { circuits: Doc[]; loads: Doc[]; panels: Doc[]; rooms: Doc[] };
	fn(d);
	return d;
}

describe('parseJobDocument', () => {
	test('accepts a sound document and fills defaults', () => {
		const r = parseJobDocument(base());
		expect(r.ok).toBe(true);
		if (r.ok) {
			expect(r.doc.terminalTemperatureC).toBe(75);
			expect(r.doc.circuits[0]?.breakerType).toBe('standard');
		}
	});

	test.each<[string, Doc | unknown, string]>([
		[
			'a non-standard breaker rating',
			edit((d) => ((d.circuits[1] as Doc).ratingA = 22)),
			'circuits[1].ratingA: 22 A is not a standard breaker rating (NEC 240.6(A))',
		],
		[
			'a rating given as text',
			edit((d) => ((d.circuits[0] as Doc).ratingA = 'twenty')),
			'circuits[0].ratingA: "twenty" is not a number of amperes',
		],
		[
			'an unknown conductor size',
			edit((d) => ((d.circuits[0] as Doc).conductor = { size: '13', material: 'cu', insulationC: 90 })),
			'circuits[0].conductor.size: "13" is not a conductor size',
		],
		[
			'an unknown code edition',
			edit((d) => (d.codeEdition = '2011')),
			'codeEdition: "2011" is not a supported code edition',
		],
		[
			'an unknown room type',
			edit((d) => ((d.rooms[0] as Doc).type = 'ballroom')),
			'rooms[0].type: "ballroom" is not a room type',
		],
		[
			'a negative length',
			edit((d) => ((d.circuits[0] as Doc).lengthFt = -3)),
			'circuits[0].lengthFt: must be 0 ft or more',
		],
		[
			'a missing rating on a load',
			edit((d) => delete (d.loads[0] as Doc).va),
			'loads[0].va: give the rating: one of va, watts or hp',
		],
		[
			'two ratings on a load',
			edit((d) => ((d.loads[0] as Doc).watts = 100)),
			'loads[0]: give only one of va, watts or hp, not several',
		],
		[
			'an unknown horsepower',
			edit((d) => {
				delete (d.loads[0] as Doc).va;
				(d.loads[0] as Doc).hp = '4';
			}),
			'loads[0].hp: "4" is not a horsepower in Table 430.248',
		],
		[
			'an unknown field',
			edit((d) => ((d.circuits[0] as Doc).colour = 'red')),
			'circuits[0]: unknown field "colour"',
		],
		['a missing panel list', edit((d) => delete (d as Doc).panels), 'panels: is required'],
		[
			'a fractional position',
			edit((d) => ((d.circuits[0] as Doc).position = 1.5)),
			'circuits[0].position: 1.5 is not a whole position number',
		],
		[
			'a circuit in an unknown panel',
			edit((d) => ((d.circuits[0] as Doc).panelId = 'p9')),
			'circuits[0].panelId: no panel has id "p9"',
		],
		[
			'a load on an unknown circuit',
			edit((d) => ((d.loads[0] as Doc).circuitId = 'c9')),
			'loads[0].circuitId: no circuit has id "c9"',
		],
		[
			'an unknown room on a circuit',
			edit((d) => ((d.circuits[0] as Doc).roomIds = ['r9'])),
			'circuits[0].roomIds[0]: no room has id "r9"',
		],
		[
			'a duplicate id',
			edit((d) => ((d.circuits[1] as Doc).id = 'c1')),
			'circuits[1].id: "c1" is already used by circuits[0]; ids must be unique',
		],
		[
			'a 240 V load on a 1-pole circuit',
			edit((d) => ((d.loads[0] as Doc).voltage = 240)),
			'loads[0].voltage: a 240 V load cannot be supplied by 1-pole circuit "c1" at 120 V',
		],
		[
			'a 3-pole breaker in a single-phase panel',
			edit((d) => ((d.circuits[0] as Doc).poles = 3)),
			'circuits[0].poles: a 3-pole breaker needs a three-phase panelboard',
		],
		[
			'a circuit paired with itself',
			edit((d) => ((d.circuits[0] as Doc).multiwireWith = 'c1')),
			'circuits[0].multiwireWith: a circuit cannot share a neutral with itself',
		],
		[
			'a subpanel with no feeder',
			edit((d) =>
				d.panels.push({
					id: 'p2',
					name: 'Sub',
					kind: 'sub',
					voltageSystem: '120/240-1ph-3w',
					busRatingA: 100,
					mainBreakerA: null,
					spaces: 12,
				}),
			),
			'panels[1].fedFromCircuitId: a subpanel must name the circuit that supplies it',
		],
		[
			'a subpanel fed by a 1-pole circuit',
			edit((d) =>
				d.panels.push({
					id: 'p2',
					name: 'Sub',
					kind: 'sub',
					fedFromCircuitId: 'c2',
					voltageSystem: '120/240-1ph-3w',
					busRatingA: 100,
					mainBreakerA: null,
					spaces: 12,
				}),
			),
			'panels[1].fedFromCircuitId: circuit "c2" is 1-pole',
		],
		['no main panel', edit((d) => ((d.panels[0] as Doc).kind = 'sub')), "panels: no panel is of kind 'main'"],
		[
			'a service rating that is not standard',
			edit((d) => ((d as Doc).service = { ratingA: 120, voltageSystem: '120/240-1ph-3w' })),
			'service.ratingA: 120 A is not a standard rating (NEC 240.6(A))',
		],
		['a document that is not an object', 'hello', '(document): '],
	])('rejects %s with its own message', (_what, input, message) => {
		const r = parseJobDocument(input);
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.errors.some((e) => e.startsWith(message))).toBe(true);
	});

	test('panels feeding each other in a loop are rejected', () => {
		const d = edit((x) => {
			x.panels[0] = {
				id: 'p1',
				name: 'Main',
				kind: 'main',
				voltageSystem: '120/240-1ph-3w',
				busRatingA: 200,
				mainBreakerA: 200,
				spaces: 40,
			};
			x.panels.push({
				id: 'p2',
				name: 'A',
				kind: 'sub',
				fedFromCircuitId: 'f3',
				voltageSystem: '120/240-1ph-3w',
				busRatingA: 100,
				mainBreakerA: null,
				spaces: 12,
			});
			x.panels.push({
				id: 'p3',
				name: 'B',
				kind: 'sub',
				fedFromCircuitId: 'f2',
				voltageSystem: '120/240-1ph-3w',
				busRatingA: 100,
				mainBreakerA: null,
				spaces: 12,
			});
			x.circuits.push(circuit({ id: 'f2', panelId: 'p2', position: 1, poles: 2 }));
			x.circuits.push(circuit({ id: 'f3', panelId: 'p3', position: 1, poles: 2 }));
		});
		const r = parseJobDocument(d);
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.errors.join('\n')).toContain('feed each other in a loop');
	});

	test('a position beyond the panel is a finding, not an input error', () => {
		const r = parseJobDocument(edit((d) => ((d.circuits[0] as Doc).position = 99)));
		expect(r.ok).toBe(true);
	});
});

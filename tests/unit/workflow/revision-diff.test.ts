import { describe, expect, test } from 'vitest';
import { DEMO_JOB_DOCUMENT } from '../../../seeds/data/demo-job';
import { computeJob, parseJobDocument } from '../../../src/lib/electrical';
import type { JobDocument } from '../../../src/lib/electrical/schema';
import {
	diffRevisions,
	type CommentForDiff,
	type RevisionSnapshot,
} from '../../../src/lib/workflow/revision-diff';

function parsed(): JobDocument {
	const p = parseJobDocument(structuredClone(DEMO_JOB_DOCUMENT));
	if (!p.ok) throw new Error(p.errors.join('\n'));
	return p.doc;
}

/** A revision as stored: the document and the engine's results through JSON, as the database keeps them. */
function snapshot(number: number, doc: JobDocument): RevisionSnapshot {
	return {
		number,
		document: JSON.parse(JSON.stringify(doc)),
		results: JSON.parse(JSON.stringify(computeJob(doc))),
		submittedAt: `2026-11-0${number}T10:00:00.000Z`,
	};
}

function comment(over: Partial<CommentForDiff>): CommentForDiff {
	return {
		id: over.id ?? 'c1',
		revisionNumber: 1,
		targetKind: 'circuit',
		panelId: null,
		circuitId: null,
		targetLabel: '',
		sheet: null,
		body: 'Please look at this.',
		status: 'open',
		answers: [],
		...over,
	};
}

const first = parsed();

describe('changes between revisions', () => {
	test('two identical revisions have no record changes and no changed figures', () => {
		const d = diffRevisions(snapshot(1, first), snapshot(2, parsed()));
		expect(d.records).toEqual([]);
		expect(d.figures.length).toBeGreaterThan(0);
		expect(d.figures.filter((f) => f.changed)).toEqual([]);
	});

	test('a changed circuit lists each changed field with its value before and after', () => {
		const next = parsed();
		const c = next.circuits.find((x) => x.id === 'sa1')!;
		c.ratingA = 25 as never;
		c.conductor = { ...c.conductor, size: '10' };
		const d = diffRevisions(snapshot(1, first), snapshot(2, next));
		expect(d.records).toHaveLength(1);
		const r = d.records[0]!;
		expect(r).toMatchObject({
			kind: 'circuit',
			id: 'sa1',
			change: 'changed',
			title: 'Circuit 13 “Kitchen counter left”',
		});
		expect(r.fields).toEqual([
			{ field: 'ratingA', before: 20, after: 25 },
			{
				field: 'conductor',
				before: { size: '12', material: 'cu', insulationC: 90 },
				after: { size: '10', material: 'cu', insulationC: 90 },
			},
		]);
		expect(r.panelIds).toEqual(['main']);
	});

	test('added and removed panels, circuits and loads are listed with the whole record', () => {
		const next = parsed();
		next.panels.push({
			...next.panels[1]!,
			id: 'shop',
			name: 'Shop subpanel',
			fedFromCircuitId: null,
			kind: 'main',
		});
		next.circuits = next.circuits.filter((c) => c.id !== 'microwave');
		next.loads = next.loads.filter((l) => l.circuitId !== 'microwave');
		next.circuits.push({
			...next.circuits.find((c) => c.id === 'fridge')!,
			id: 'shop-1',
			panelId: 'shop',
			position: 1,
			label: 'Bench',
		});
		next.loads.push({
			...next.loads.find((l) => l.id === 'l-fridge')!,
			id: 'l-bench',
			circuitId: 'shop-1',
			description: 'Bench grinder',
		});
		const d = diffRevisions(snapshot(1, first), snapshot(2, next));
		const summary = d.records.map((r) => `${r.change} ${r.kind} ${r.id}`);
		expect(summary).toEqual(
			expect.arrayContaining([
				'added panel shop',
				'added circuit shop-1',
				'added load l-bench',
				'removed circuit microwave',
				'removed load l-microwave',
			]),
		);
		expect(summary).toHaveLength(5);
		const removed = d.records.find((r) => r.id === 'microwave')!;
		expect(removed.before).toMatchObject({ label: 'Microwave', position: 18 });
		expect(removed.after).toBeNull();
		const added = d.records.find((r) => r.id === 'shop')!;
		expect(added.after).toMatchObject({ name: 'Shop subpanel' });
		expect(added.before).toBeNull();
	});

	test('records that only moved in the list are not changes', () => {
		const next = parsed();
		next.circuits.reverse();
		next.rooms.reverse();
		expect(diffRevisions(snapshot(1, first), snapshot(2, next)).records).toEqual([]);
	});

	test('a changed load and a changed room are named and compared field by field', () => {
		const next = parsed();
		next.loads.find((l) => l.id === 'l-dishwasher')!.va = 1500;
		next.rooms.find((r) => r.id === 'bed2')!.name = 'Bedroom 2 (nursery)';
		const d = diffRevisions(snapshot(1, first), snapshot(2, next));
		const load = d.records.find((r) => r.kind === 'load')!;
		expect(load.fields).toEqual([{ field: 'va', before: expect.any(Number), after: 1500 }]);
		expect(load.circuitIds).toEqual(['dishwasher']);
		expect(load.panelIds).toEqual(['main']);
		const room = d.records.find((r) => r.kind === 'room')!;
		expect(room).toMatchObject({ title: 'Room “Bedroom 2 (nursery)”', titleBefore: 'Room “Bedroom 2”' });
	});

	test('a change of the service shows as a job change and moves the calculation figures', () => {
		const next = parsed();
		next.service.ratingA = 100 as never;
		const d = diffRevisions(snapshot(1, first), snapshot(2, next));
		expect(d.records).toEqual([
			expect.objectContaining({
				kind: 'job',
				fields: [{ field: 'service.ratingA', before: 200, after: 100 }],
			}),
		]);
		const headroom = d.figures.find((f) => f.key === 'service.standard.headroomA')!;
		expect(headroom.changed).toBe(true);
		// Headroom is the service rating less the calculated current: 100 A less.
		expect(headroom.before! - headroom.after!).toBeCloseTo(100, 6);
		expect(d.figures.find((f) => f.key === 'service.standard.totalVA')!.changed).toBe(false);
	});

	test('a load added to a circuit raises the calculated load of the service and of its panel', () => {
		const next = parsed();
		next.loads.push({
			...next.loads.find((l) => l.id === 'l-fridge')!,
			id: 'l-wine',
			description: 'Wine cooler',
			va: 400,
		});
		const d = diffRevisions(snapshot(1, first), snapshot(2, next));
		const panel = d.figures.find((f) => f.key === 'panel.main.connectedVA')!;
		expect(panel.after! - panel.before!).toBeCloseTo(400, 6);
		expect(panel.label).toBe('Panel “Main panel”: connected load');
		const service = d.figures.find((f) => f.key === 'service.standard.totalVA')!;
		expect(service.changed).toBe(true);
		expect(service.after!).toBeGreaterThan(service.before!);
	});

	test('the first revision has nothing to compare: no records, figures with no value before', () => {
		const d = diffRevisions(null, snapshot(1, first), [comment({ circuitId: 'sa1' })]);
		expect(d.from).toBeNull();
		expect(d.records).toEqual([]);
		expect(d.comments).toEqual([]);
		expect(d.figures.every((f) => f.before === null && f.after !== null)).toBe(true);
	});

	test.each([
		[
			'a comment on the changed circuit',
			comment({ id: 'on-circuit', targetKind: 'circuit', circuitId: 'sa1', panelId: 'main' }),
			['circuit:sa1'],
		],
		[
			'a comment on the circuit’s panel',
			comment({ id: 'on-panel', targetKind: 'panel', panelId: 'main' }),
			['circuit:sa1', 'load:l-dishwasher'],
		],
		[
			'a comment on the circuit of a changed load',
			comment({ id: 'on-load-circuit', circuitId: 'dishwasher' }),
			['load:l-dishwasher'],
		],
		[
			'a comment on another panel',
			comment({ id: 'other-panel', targetKind: 'panel', panelId: 'garage' }),
			[],
		],
		['a comment on a sheet', comment({ id: 'sheet', targetKind: 'sheet', sheet: 2 }), []],
	])('%s is answered by %j', (_name, c, expected) => {
		const next = parsed();
		next.circuits.find((x) => x.id === 'sa1')!.ratingA = 25 as never;
		next.loads.find((l) => l.id === 'l-dishwasher')!.va = 1500;
		const d = diffRevisions(snapshot(1, first), snapshot(2, next), [c]);
		expect(d.comments).toHaveLength(1);
		expect(d.comments[0]!.answeredBy).toEqual(expected);
		for (const key of expected) expect(d.records.find((r) => r.key === key)!.answers).toEqual([c.id]);
	});

	test('comments made on the later revision are not mapped to its changes', () => {
		const next = parsed();
		next.circuits.find((x) => x.id === 'sa1')!.ratingA = 25 as never;
		const d = diffRevisions(snapshot(1, first), snapshot(2, next), [
			comment({ id: 'later', revisionNumber: 2, circuitId: 'sa1' }),
		]);
		expect(d.comments).toEqual([]);
		expect(d.records[0]!.answers).toEqual([]);
	});
});

import { describe, expect, test } from 'vitest';
import { matchSlots, panelMapData } from '../../../src/lib/documents/panel-map';
import { computeJob } from '../../../src/lib/electrical';
import { exampleDocument } from '../../fixtures/documents';

const doc = exampleDocument('quillmere-cottage');
const map = panelMapData(doc, computeJob(doc), [], '/card');
const main = map.panels[0]!;
const labelsAt = (hits: Set<number>) => [...hits].map((p) => main.slots.find((s) => s.position === p)!.label);

describe('panel map search', () => {
	test('draws every position of each panel, odd and even, with spaces marked', () => {
		const panel = doc.panels[0]!;
		expect(main.slots.map((s) => s.position)).toEqual(Array.from({ length: panel.spaces }, (_, i) => i + 1));
		expect(main.slots.filter((s) => s.kind === 'space').length).toBe(computeJob(doc).panels[0]!.free);
	});

	test.each([
		['dishwasher', ['Dishwasher']],
		['garage', ['EV charger, garage', 'Garage receptacles and lights']],
		['breaker 14', ['EV charger, garage']],
		['14', ['EV charger, garage']],
		['#19', ['Dishwasher']],
	])('"%s" highlights the breakers that feed it', (query, labels) => {
		expect(new Set(labelsAt(matchSlots(main, query)))).toEqual(new Set(labels));
	});

	test('a 2-pole breaker is found by either of its positions, and both light up', () => {
		const hits = matchSlots(main, 'breaker 3');
		expect([...hits].sort((a, b) => a - b)).toEqual([1, 3]);
	});

	test('each circuit carries its rooms and loads', () => {
		const dish = main.slots.find((s) => s.label === 'Dishwasher')!;
		expect(dish.rooms).toEqual(['Kitchen']);
		expect(dish.loads.length).toBeGreaterThan(0);
	});

	test.each([[''], ['   '], ['sauna'], ['breaker 99']])('"%s" highlights nothing', (query) => {
		expect(matchSlots(main, query).size).toBe(0);
	});
});

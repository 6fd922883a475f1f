import { describe, expect, test } from 'vitest';
import { engineMessageInWords } from '../../../src/lib/client/engine-messages';

describe('engine messages in words', () => {
	test.each([
		['loads[2].voltage: must be 120, 208 or 240', 'Load 3, voltage: must be 120, 208 or 240'],
		['circuits[0].conductor.size: "5" is not a size', 'Circuit 1, conductor size: "5" is not a size'],
		['circuits[3].roomIds[1]: no room has id "x"', 'Circuit 4, room 2: no room has id "x"'],
		['rooms[0].areaFt2: must be 0 ft² or more', 'Room 1, area: must be 0 ft² or more'],
		['service.ratingA: 17 A is not a standard rating', 'Service rating: 17 A is not a standard rating'],
		["panels: no panel is of kind 'main'", "Panels: no panel is of kind 'main'"],
		['(document): must be an object', '(document): must be an object'],
		['A sentence with no path', 'A sentence with no path'],
	])('%s reads as %s', (line, expected) => {
		expect(engineMessageInWords(line)).toBe(expected);
	});

	test('a caller can name the records in its own terms', () => {
		const named = engineMessageInWords('loads[7].voltage: cannot be supplied', (list, i) =>
			list === 'loads' && i === 7 ? 'Circuit 3, load 2' : undefined,
		);
		expect(named).toBe('Circuit 3, load 2, voltage: cannot be supplied');
	});
});

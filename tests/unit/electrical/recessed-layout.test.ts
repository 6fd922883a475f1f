import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { layoutRecessedLights, recessedLightLoads } from '../../../src/lib/electrical/index';
import type { RecessedLayout, RecessedLayoutInput } from '../../../src/lib/electrical/index';

function ok(input: RecessedLayoutInput): RecessedLayout {
	const r = layoutRecessedLights(input);
	if (!r.ok) throw new Error(r.errors.join('\n'));
	return r.layout;
}

describe('recessed-light layout', () => {
	test('a 12 × 10 ft room with an 8 ft ceiling gets a 3 × 3 grid at half the ceiling height or less', () => {
		// Rule of thumb (nec-check-values.md, common practice): spacing about half the ceiling height, 8 / 2 = 4 ft.
		// Hand: columns ceil(12 / 4) = 3, 4 ft apart, 2 ft from the walls; rows ceil(10 / 4) = 3, 3.33 ft apart, 1.67 ft from the walls.
		const l = ok({ lengthFt: 12, widthFt: 10, ceilingHeightFt: 8, fixtureDiameterIn: 4 });
		expect([l.rows, l.columns, l.count]).toEqual([3, 3, 9]);
		expect(l.spacingX.value).toBe(4);
		expect(l.wallOffsetX.value).toBe(2);
		expect(l.spacingY.value).toBeCloseTo(10 / 3, 9);
		expect(l.fixtures.map((f) => f.x).slice(0, 3)).toEqual([2, 6, 10]);
	});

	test('a fixture over a joist moves the least distance that clears it, mirrored about the centre', () => {
		// Hand: joists along the width at 16 in centres from 0: lines at x = 0, 1.333, 2.667, 4, 5.333, ... ft.
		// Clearance = 2 in radius + 0.25 in margin + 0.75 in half joist = 3 in = 0.25 ft (common practice).
		// Ideal x = 2, 6, 10; x = 2 lies 0.667 ft from the 1.333 ft and 2.667 ft joists: clear, no move.
		// x = 6 lies 0.667 ft from 5.333 and 6.667: clear; x = 10 is 0.667 from 9.333 and 10.667: clear.
		const l = ok({
			lengthFt: 12,
			widthFt: 10,
			ceilingHeightFt: 8,
			fixtureDiameterIn: 4,
			joists: { direction: 'along-width', spacingIn: 16, firstOffsetIn: 0 },
		});
		expect(l.fixtures.every((f) => f.movedIn === 0)).toBe(true);
		// Hand: with the first joist at 24 in and 24 in centres, lines at x = 2, 4, 6, 8, 10 ft: every column sits on a joist.
		// Each must move 0.25 ft = 3 in; the pairs (2, 10) move to (1.75, 10.25) mirrored, the middle to 5.75 or 6.25.
		const m = ok({
			lengthFt: 12,
			widthFt: 10,
			ceilingHeightFt: 8,
			fixtureDiameterIn: 4,
			joists: { direction: 'along-width', spacingIn: 24, firstOffsetIn: 24 },
		});
		const xs = m.fixtures.filter((f) => f.row === 1).map((f) => f.x);
		expect(xs[0]).toBeCloseTo(1.75, 9);
		expect(xs[2]).toBeCloseTo(10.25, 9);
		expect(Math.abs((xs[1] as number) - 6)).toBeCloseTo(0.25, 9);
		expect(m.symmetric).toBe(false);
		expect(m.notes.join(' ')).toContain('column 2 sits on the centre line over a joist');
		expect(m.fixtures[0]?.movedIn).toBeCloseTo(3, 9);
	});

	test('a chosen count overrides the rule of thumb', () => {
		const l = ok({
			lengthFt: 20,
			widthFt: 12,
			ceilingHeightFt: 9,
			fixtureDiameterIn: 6,
			spacing: { rule: 'count', rows: 2, columns: 4 },
		});
		expect([l.rows, l.columns]).toEqual([2, 4]);
		expect(l.spacingX.value).toBe(5);
	});

	test('the fixtures become one lighting load on the chosen circuit', () => {
		const l = ok({ lengthFt: 12, widthFt: 10, ceilingHeightFt: 8, fixtureDiameterIn: 4 });
		const [load] = recessedLightLoads(l, { circuitId: 'c7', vaPerFixture: 12, roomIds: ['kitchen'] });
		expect(load).toMatchObject({ circuitId: 'c7', kind: 'lighting', quantity: 9, va: 12, voltage: 120 });
	});

	test.each<[string, RecessedLayoutInput, string]>([
		[
			'a zero length',
			{ lengthFt: 0, widthFt: 10, ceilingHeightFt: 8, fixtureDiameterIn: 4 },
			'lengthFt: must be more than 0 feet',
		],
		[
			'joists closer than the hole',
			{
				lengthFt: 12,
				widthFt: 10,
				ceilingHeightFt: 8,
				fixtureDiameterIn: 8,
				joists: { direction: 'along-length', spacingIn: 8, firstOffsetIn: 0 },
			},
			'joists: no position',
		],
		[
			'an offset wider than the room',
			{ lengthFt: 6, widthFt: 6, ceilingHeightFt: 8, fixtureDiameterIn: 4, wallOffsetFt: 4 },
			'wallOffsetFt:',
		],
	])('rejects %s', (_what, input, message) => {
		const r = layoutRecessedLights(input);
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.errors.join('\n')).toContain(message);
	});

	const inputArb = fc.record({
		lengthFt: fc.double({ min: 6, max: 40, noNaN: true }),
		widthFt: fc.double({ min: 6, max: 40, noNaN: true }),
		ceilingHeightFt: fc.double({ min: 7, max: 14, noNaN: true }),
		fixtureDiameterIn: fc.constantFrom(3, 4, 5, 6),
		direction: fc.constantFrom('along-length', 'along-width' as const),
		spacingIn: fc.constantFrom(12, 16, 19.2, 24),
		firstOffsetIn: fc.double({ min: 0, max: 24, noNaN: true }),
	});

	test('every fixture lies inside the room and clears every joist by at least its radius', () => {
		fc.assert(
			fc.property(inputArb, (p) => {
				const r = layoutRecessedLights({
					...p,
					joists: { direction: p.direction, spacingIn: p.spacingIn, firstOffsetIn: p.firstOffsetIn },
				});
				if (!r.ok) return;
				const radius = p.fixtureDiameterIn / 24;
				for (const f of r.layout.fixtures) {
					expect(f.x).toBeGreaterThanOrEqual(radius - 1e-9);
					expect(f.x).toBeLessThanOrEqual(p.lengthFt - radius + 1e-9);
					expect(f.y).toBeGreaterThanOrEqual(radius - 1e-9);
					expect(f.y).toBeLessThanOrEqual(p.widthFt - radius + 1e-9);
					const across = p.direction === 'along-length' ? f.y : f.x;
					for (const j of r.layout.joistLinesFt)
						expect(Math.abs(across - j)).toBeGreaterThanOrEqual(radius - 1e-9);
				}
			}),
		);
	});

	test('fixtures mirror each other about the centre lines when the joists are symmetric', () => {
		fc.assert(
			fc.property(inputArb, (p) => {
				// Joists symmetric about the centre: first offset chosen so the last joist sits as far from the far wall.
				const across = (p.direction === 'along-length' ? p.widthFt : p.lengthFt) * 12;
				const k = Math.floor(across / p.spacingIn);
				const first = (across - k * p.spacingIn) / 2;
				const r = layoutRecessedLights({
					...p,
					joists: { direction: p.direction, spacingIn: p.spacingIn, firstOffsetIn: first },
				});
				if (!r.ok) return;
				const l = r.layout;
				const at = (row: number, col: number) => l.fixtures.find((f) => f.row === row && f.column === col);
				for (const f of l.fixtures) {
					const mirrorCol = at(f.row, l.columns + 1 - f.column);
					const mirrorRow = at(l.rows + 1 - f.row, f.column);
					const onCentreCol = 2 * f.column === l.columns + 1;
					const onCentreRow = 2 * f.row === l.rows + 1;
					if (!onCentreCol) expect((f.x + (mirrorCol?.x ?? NaN)) / 2).toBeCloseTo(p.lengthFt / 2, 9);
					if (!onCentreRow) expect((f.y + (mirrorRow?.y ?? NaN)) / 2).toBeCloseTo(p.widthFt / 2, 9);
				}
				if (!l.symmetric) expect(l.notes.some((n) => n.includes('centre line'))).toBe(true);
			}),
		);
	});
});

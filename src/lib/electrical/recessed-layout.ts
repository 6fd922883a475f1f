/**
 * Recessed-light layout for a rectangular room: an even grid from a spacing rule of thumb or a
 * chosen count, each row or column line moved the least distance needed so that every hole clears
 * the ceiling joists, mirrored about the room's centre lines where the joists allow.
 * x runs along the room's length, y along its width, both from one corner, in feet.
 */
import { z } from 'zod';
import { fig, num, q } from './format';
import { formatPath } from './parse';
import type { Load } from './schema';
import { COMMON_PRACTICE } from './sections';
import type { Figure } from './types';

const ft = (what: string, max: number) =>
	z
		.number({
			error: (iss) =>
				iss.input === undefined ? 'is required' : `${String(iss.input)} is not a number of ${what}`,
		})
		.positive({ error: `must be more than 0 ${what}` })
		.max(max, { error: `must be at most ${max} ${what}` });

export const recessedLayoutInputSchema = z.strictObject({
	lengthFt: ft('feet', 500).describe('Room length (x axis), ft.'),
	widthFt: ft('feet', 500).describe('Room width (y axis), ft.'),
	ceilingHeightFt: ft('feet', 60).describe('Ceiling height above the floor, ft.'),
	fixtureDiameterIn: ft('inches', 24).describe('Hole (fixture) diameter, in.'),
	wallOffsetFt: z
		.number({ error: 'must be a number of feet' })
		.nonnegative({ error: 'must be 0 ft or more' })
		.nullable()
		.default(null)
		.describe('Distance from the walls to the outer fixtures, ft. null: half the spacing.'),
	spacing: z
		.discriminatedUnion(
			'rule',
			[
				z.strictObject({ rule: z.literal('half-ceiling-height') }),
				z.strictObject({
					rule: z.literal('spacing-criterion'),
					criterion: ft('(spacing criterion)', 3),
					workPlaneFt: z.number({ error: 'must be a number of feet' }).nonnegative().default(2.5),
				}),
				z.strictObject({
					rule: z.literal('count'),
					rows: z.int({ error: 'must be a whole number' }).min(1, { error: 'must be 1 or more' }).max(100),
					columns: z.int({ error: 'must be a whole number' }).min(1, { error: 'must be 1 or more' }).max(100),
				}),
			],
			{ error: "must have rule 'half-ceiling-height', 'spacing-criterion' or 'count'" },
		)
		.default({ rule: 'half-ceiling-height' }),
	joists: z
		.strictObject({
			direction: z.enum(['along-length', 'along-width'], {
				error: "must be 'along-length' or 'along-width'",
			}),
			spacingIn: ft('inches', 96).describe('Joist spacing on centre, in (commonly 16 or 24).'),
			firstOffsetIn: z
				.number({ error: 'must be a number of inches' })
				.nonnegative({ error: 'must be 0 in or more' })
				.describe('From the wall at 0 to the centre of the first joist, in.'),
			thicknessIn: z.number({ error: 'must be a number of inches' }).positive().max(12).default(1.5),
		})
		.nullable()
		.default(null),
	marginIn: z.number({ error: 'must be a number of inches' }).nonnegative().max(6).default(0.25),
});

export type RecessedLayoutInput = z.input<typeof recessedLayoutInputSchema>;
type Parsed = z.infer<typeof recessedLayoutInputSchema>;

export interface FixturePosition {
	id: string;
	row: number;
	column: number;
	x: number;
	y: number;
	idealX: number;
	idealY: number;
	/** How far the fixture moved from its even-grid position to clear a joist, in. */
	movedIn: number;
}

export interface RecessedLayout {
	rows: number;
	columns: number;
	count: number;
	targetSpacing: Figure | null;
	spacingX: Figure;
	spacingY: Figure;
	wallOffsetX: Figure;
	wallOffsetY: Figure;
	/** Smallest distance from a joist centre line to a fixture centre. */
	joistClearance: Figure | null;
	/** Joist centre lines across the room, ft (x for joists along the width, y for joists along the length). */
	joistLinesFt: number[];
	fixtures: FixturePosition[];
	symmetric: boolean;
	notes: string[];
}

export type LayoutResult = { ok: true; layout: RecessedLayout } | { ok: false; errors: string[] };

type Interval = [number, number];

/** [lo, hi] less the open intervals (j − d, j + d). */
function allowedIntervals(lo: number, hi: number, joists: readonly number[], d: number): Interval[] {
	const out: Interval[] = [];
	let start = lo;
	for (const j of joists) {
		const a = j - d;
		const b = j + d;
		if (b <= start) continue;
		if (a >= hi) break;
		if (a > start) out.push([start, a]);
		start = Math.max(start, b);
		if (start > hi) break;
	}
	if (start <= hi) out.push([start, hi]);
	return out;
}

function intersect(a: readonly Interval[], b: readonly Interval[]): Interval[] {
	const out: Interval[] = [];
	let i = 0;
	let k = 0;
	while (i < a.length && k < b.length) {
		const x = a[i] as Interval;
		const y = b[k] as Interval;
		const lo = Math.max(x[0], y[0]);
		const hi = Math.min(x[1], y[1]);
		if (lo <= hi) out.push([lo, hi]);
		if (x[1] < y[1]) i++;
		else k++;
	}
	return out;
}

function nearest(c: number, set: readonly Interval[]): number | null {
	let best: number | null = null;
	let bestD = Number.POSITIVE_INFINITY;
	for (const [a, b] of set) {
		const p = c < a ? a : c > b ? b : c;
		const dd = Math.abs(p - c);
		if (dd < bestD - 1e-12) {
			best = p;
			bestD = dd;
		}
	}
	return best;
}

interface AxisPlan {
	n: number;
	ideal: number[];
	spacing: number;
	offset: number;
	working: string;
}

function planAxis(length: number, n0: number | null, target: number | null, offset: number | null): AxisPlan {
	let n: number;
	if (n0 !== null) n = n0;
	else {
		const s = target ?? length;
		n =
			offset === null
				? Math.max(1, Math.ceil(length / s - 1e-9))
				: length - 2 * offset > 1e-9
					? Math.ceil((length - 2 * offset) / s - 1e-9) + 1
					: 1;
	}
	const ideal: number[] = [];
	if (n === 1) {
		ideal.push(length / 2);
		return {
			n,
			ideal,
			spacing: 0,
			offset: length / 2,
			working: `one line at the centre, ${q(length / 2, 'ft')}`,
		};
	}
	if (offset === null) {
		const s = length / n;
		for (let i = 0; i < n; i++) ideal.push((i + 0.5) * s);
		return {
			n,
			ideal,
			spacing: s,
			offset: s / 2,
			working: `${q(length, 'ft')} ÷ ${n} = ${q(s, 'ft')} apart, ${q(s / 2, 'ft')} from the walls`,
		};
	}
	const s = (length - 2 * offset) / (n - 1);
	for (let i = 0; i < n; i++) ideal.push(offset + i * s);
	return {
		n,
		ideal,
		spacing: s,
		offset,
		working: `(${q(length, 'ft')} − 2 × ${q(offset, 'ft')}) ÷ ${n - 1} = ${q(s, 'ft')} apart`,
	};
}

interface AxisPlacement {
	pos: number[];
	symmetric: boolean;
	notes: string[];
}

function placeAxis(
	plan: AxisPlan,
	length: number,
	lo: number,
	hi: number,
	joists: readonly number[] | null,
	d: number,
	lineName: string,
): AxisPlacement | string {
	if (joists === null) return { pos: [...plan.ideal], symmetric: true, notes: [] };
	const allowed = allowedIntervals(lo, hi, joists, d);
	if (allowed.length === 0)
		return `no position across the ${lineName === 'row' ? 'width' : 'length'} clears the joists: the hole and its clearance are wider than the space between joists`;
	const mirrored: Interval[] = allowed.map(([a, b]) => [length - b, length - a] as Interval).reverse();
	const sym = intersect(allowed, mirrored);
	const n = plan.n;
	const pos = new Array<number>(n).fill(0);
	const notes: string[] = [];
	let symmetric = true;
	for (let i = 0; i < Math.floor(n / 2); i++) {
		const j = n - 1 - i;
		const c = plan.ideal[i] as number;
		const s = nearest(c, sym);
		if (s !== null) {
			pos[i] = s;
			pos[j] = length - s;
		} else {
			pos[i] = nearest(c, allowed) ?? c;
			pos[j] = nearest(plan.ideal[j] as number, allowed) ?? (plan.ideal[j] as number);
			symmetric = false;
			notes.push(
				`${lineName}s ${i + 1} and ${j + 1} could not be mirrored about the centre line: the joists are not symmetric there.`,
			);
		}
	}
	if (n % 2 === 1) {
		const m = (n - 1) / 2;
		const c = plan.ideal[m] as number;
		const p = nearest(c, allowed) ?? c;
		pos[m] = p;
		if (Math.abs(p - c) > 1e-9) {
			symmetric = false;
			notes.push(
				`${lineName} ${m + 1} sits on the centre line over a joist; it moved ${q(Math.abs(p - c) * 12, 'in')} to one side, so the layout is not symmetric there.`,
			);
		}
	}
	return { pos, symmetric, notes };
}

/** Lays out recessed lights in a room; returns positions, spacing and notes, or the input errors. */
export function layoutRecessedLights(input: RecessedLayoutInput): LayoutResult {
	const parsed = recessedLayoutInputSchema.safeParse(input);
	if (!parsed.success)
		return { ok: false, errors: parsed.error.issues.map((i) => `${formatPath(i.path)}: ${i.message}`) };
	return layout(parsed.data);
}

function layout(p: Parsed): LayoutResult {
	const L = p.lengthFt;
	const W = p.widthFt;
	const r = p.fixtureDiameterIn / 24; // hole radius, ft
	if (2 * r > Math.min(L, W))
		return { ok: false, errors: ['fixtureDiameterIn: the fixture is wider than the room'] };
	let target: number | null = null;
	let targetSpacing: Figure | null = null;
	if (p.spacing.rule === 'half-ceiling-height') {
		target = p.ceilingHeightFt / 2;
		targetSpacing = fig(
			target,
			'ft',
			COMMON_PRACTICE,
			`about half the ceiling height: ${q(p.ceilingHeightFt, 'ft')} ÷ 2 = ${q(target, 'ft')}`,
		);
	} else if (p.spacing.rule === 'spacing-criterion') {
		const above = p.ceilingHeightFt - p.spacing.workPlaneFt;
		if (above <= 0)
			return { ok: false, errors: ['spacing.workPlaneFt: the work plane must be below the ceiling'] };
		target = p.spacing.criterion * above;
		targetSpacing = fig(
			target,
			'ft',
			COMMON_PRACTICE,
			`spacing criterion ${num(p.spacing.criterion)} × (${q(p.ceilingHeightFt, 'ft')} − ${q(p.spacing.workPlaneFt, 'ft')} work plane) = ${q(target, 'ft')}`,
		);
	}
	const off = p.wallOffsetFt;
	if (off !== null && (2 * off > L || 2 * off > W)) {
		return {
			ok: false,
			errors: ['wallOffsetFt: twice the wall offset is more than the room length or width'],
		};
	}
	if (off !== null && off < r)
		return { ok: false, errors: ['wallOffsetFt: the offset puts part of the hole outside the room'] };
	const cols = planAxis(L, p.spacing.rule === 'count' ? p.spacing.columns : null, target, off);
	const rows = planAxis(W, p.spacing.rule === 'count' ? p.spacing.rows : null, target, off);

	for (const [axis, plan] of [
		['length', cols],
		['width', rows],
	] as const) {
		if (plan.n > 1 && plan.spacing < 2 * r)
			return { ok: false, errors: [`spacing: the fixtures along the ${axis} would overlap`] };
		if (plan.offset < r)
			return { ok: false, errors: [`spacing: the outer fixtures along the ${axis} would cut into the wall`] };
	}
	const notes: string[] = [];
	let joistClearance: Figure | null = null;
	let joistLines: number[] = [];
	let xs: AxisPlacement | string = { pos: cols.ideal, symmetric: true, notes: [] };
	let ys: AxisPlacement | string = { pos: rows.ideal, symmetric: true, notes: [] };
	if (p.joists) {
		const j = p.joists;
		const dIn = p.fixtureDiameterIn / 2 + p.marginIn + j.thicknessIn / 2;
		const d = dIn / 12;
		joistClearance = fig(
			dIn,
			'in',
			COMMON_PRACTICE,
			`hole radius ${q(p.fixtureDiameterIn / 2, 'in')} + margin ${q(p.marginIn, 'in')} + half the joist ${q(j.thicknessIn / 2, 'in')} = ${q(dIn, 'in')} from the joist centre`,
		);
		const across = j.direction === 'along-length' ? W : L;
		for (let k = 0; ; k++) {
			const at = (j.firstOffsetIn + k * j.spacingIn) / 12;
			if (at > across + d) break;
			joistLines.push(at);
		}
		if (j.direction === 'along-length') ys = placeAxis(rows, W, r, W - r, joistLines, d, 'row');
		else xs = placeAxis(cols, L, r, L - r, joistLines, d, 'column');
		if (typeof xs === 'string') return { ok: false, errors: [`joists: ${xs}`] };
		if (typeof ys === 'string') return { ok: false, errors: [`joists: ${ys}`] };
		notes.push(...xs.notes, ...ys.notes);
		joistLines = joistLines.filter((x) => x >= 0 && x <= across);
	}
	if (typeof xs === 'string' || typeof ys === 'string')
		return { ok: false, errors: ['joists: no placement'] };
	const fixtures: FixturePosition[] = [];
	for (let ri = 0; ri < rows.n; ri++) {
		for (let ci = 0; ci < cols.n; ci++) {
			const x = xs.pos[ci] as number;
			const y = ys.pos[ri] as number;
			const ix = cols.ideal[ci] as number;
			const iy = rows.ideal[ri] as number;
			fixtures.push({
				id: `R${ri + 1}C${ci + 1}`,
				row: ri + 1,
				column: ci + 1,
				x,
				y,
				idealX: ix,
				idealY: iy,
				movedIn: Math.hypot(x - ix, y - iy) * 12,
			});
		}
	}
	if (off === null && p.spacing.rule !== 'count') {
		const o = Math.min(cols.offset, rows.offset);
		if (o < 2 || o > 3)
			notes.push(`The outer fixtures sit ${q(o, 'ft')} from a wall; about 2 to 3 ft is usual.`);
	}
	const rule = COMMON_PRACTICE;
	return {
		ok: true,
		layout: {
			rows: rows.n,
			columns: cols.n,
			count: rows.n * cols.n,
			targetSpacing,
			spacingX: fig(cols.spacing, 'ft', rule, cols.working),
			spacingY: fig(rows.spacing, 'ft', rule, rows.working),
			wallOffsetX: fig(
				cols.offset,
				'ft',
				rule,
				off === null ? 'half the spacing along the length' : 'as given',
			),
			wallOffsetY: fig(
				rows.offset,
				'ft',
				rule,
				off === null ? 'half the spacing along the width' : 'as given',
			),
			joistClearance,
			joistLinesFt: joistLines,
			fixtures,
			symmetric: xs.symmetric && ys.symmetric,
			notes,
		},
	};
}

export interface RecessedLoadOptions {
	circuitId: string;
	vaPerFixture: number;
	roomIds?: string[];
	id?: string;
	status?: 'existing' | 'new' | null;
}

/** The layout's fixtures as a lighting load on a circuit (one load, quantity = fixture count). */
export function recessedLightLoads(layout: RecessedLayout, o: RecessedLoadOptions): Load[] {
	if (layout.count === 0) return [];
	return [
		{
			id: o.id ?? `${o.circuitId}-recessed`,
			circuitId: o.circuitId,
			kind: 'lighting',
			description: `${layout.count} recessed lights (${layout.rows} × ${layout.columns})`,
			quantity: layout.count,
			va: o.vaPerFixture,
			watts: null,
			hp: null,
			voltage: 120,
			continuous: false,
			cordAndPlug: false,
			status: o.status ?? null,
			spaceHeating: null,
			roomIds: o.roomIds ?? [],
		},
	];
}

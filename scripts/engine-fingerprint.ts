/**
 * Fingerprints of the engine's results: one line per job, `name sha256(JSON.stringify(computeJob(doc)))`,
 * for the example jobs, the benchmark jobs and 1,500 generated ones (seeded, so the same every time).
 * Run it before and after a change that must not alter results and compare:
 *
 *   npx tsx scripts/engine-fingerprint.ts > before.txt   (change the engine)
 *   npx tsx scripts/engine-fingerprint.ts | diff before.txt -
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import {
	BREAKER_TYPES,
	LOAD_KINDS,
	MOTOR_HP,
	ROOM_TYPES,
	SPACE_HEATING_TYPES,
	CONDUCTOR_SIZES,
	computeJob,
	parseJobDocument,
} from '../src/lib/electrical/index';
import { generatedJob } from './bench/engine';
import { largeJob } from './bench/large-job';

const root = path.dirname(path.dirname(fileURLToPath(import.meta.url)));

/** A small seeded generator (linear congruential), so that the jobs are the same on every run. */
function generator(seed: number) {
	let s = seed;
	const next = () => {
		s = (s * 1103515245 + 12345) & 0x7fffffff;
		return s / 0x7fffffff;
	};
	return {
		next,
		chance: (p: number) => next() < p,
		int: (a: number, b: number) => a + Math.floor(next() * (b - a + 1)),
		pick: <T>(xs: readonly T[]): T => xs[Math.floor(next() * xs.length)] as T,
	};
}

const RATINGS = [10, 15, 20, 25, 30, 35, 40, 45, 50, 60, 70, 80, 90, 100, 110, 125, 150, 175, 200];
type Rec = Record<string, unknown>;

/**
 * A job of up to 4 panels, 40 circuits and 200 loads with every kind of value the schema allows,
 * including wrong ones the checks must catch (positions beyond the spaces or taken twice, odd
 * multiwire pairs, mismatched voltages). Invented data.
 */
function randomJob(g: ReturnType<typeof generator>, n: number): unknown {
	const three = g.chance(0.2);
	const system = three ? '208Y/120-3ph-4w' : '120/240-1ph-3w';
	const rooms = Array.from({ length: g.int(0, 12) }, (_, i) => ({
		id: `r${i}`,
		name: g.chance(0.1) ? '' : `Room ${i}`,
		type: g.pick(ROOM_TYPES),
		areaFt2: g.int(0, 400) + (g.chance(0.3) ? 0.5 : 0),
		...(g.chance(0.1) ? { inFloorArea: g.chance(0.5) } : {}),
	}));
	const conductor = () => ({
		size: g.pick(CONDUCTOR_SIZES),
		material: g.chance(0.8) ? 'cu' : 'al',
		insulationC: g.pick([60, 75, 90]),
	});
	const panels: Rec[] = [
		{
			id: 'main',
			name: 'Main',
			kind: 'main',
			voltageSystem: system,
			busRatingA: g.pick([100, 125, 150, 200, 225]),
			mainBreakerA: g.chance(0.2) ? null : g.pick([100, 125, 150, 200, 250]),
			spaces: g.pick([2, 8, 20, 30, 40, 42]),
		},
	];
	const circuits: Rec[] = [];
	const loads: Rec[] = [];
	const subs = g.int(0, 3);
	for (let s = 0; s < subs; s++) {
		const up = g.pick(panels);
		const feeder = `f${s}`;
		circuits.push({
			id: feeder,
			panelId: up.id,
			position: g.int(1, (up.spaces as number) + 2),
			poles: up.voltageSystem === '208Y/120-3ph-4w' && g.chance(0.5) ? 3 : 2,
			ratingA: g.pick([40, 60, 100, 125]),
			conductor: conductor(),
			lengthFt: g.int(0, 200),
			label: g.chance(0.1) ? '' : `Feeder ${s}`,
			status: g.pick(['new', 'existing', 'modified']),
		});
		panels.push({
			id: `s${s}`,
			name: `Sub ${s}`,
			kind: 'sub',
			fedFromCircuitId: feeder,
			voltageSystem: g.chance(0.8) ? up.voltageSystem : system,
			busRatingA: g.pick([60, 100, 125, 225]),
			mainBreakerA: g.chance(0.6) ? null : g.pick([60, 100, 125]),
			spaces: g.pick([6, 12, 24, 42]),
		});
	}
	for (let i = 0; i < g.int(0, 40); i++) {
		const p = g.pick(panels);
		const threePhase = p.voltageSystem === '208Y/120-3ph-4w';
		const poles = threePhase && g.chance(0.1) ? 3 : g.chance(0.25) ? 2 : 1;
		const id = `c${i}`;
		const roomIds =
			rooms.length > 0 && g.chance(0.7)
				? [...new Set([g.pick(rooms).id, ...(g.chance(0.3) ? [g.pick(rooms).id] : [])])]
				: [];
		circuits.push({
			id,
			panelId: p.id,
			position: g.int(1, (p.spaces as number) + 3),
			poles,
			ratingA: g.pick(RATINGS),
			breakerType: g.pick(BREAKER_TYPES),
			conductor: conductor(),
			lengthFt: g.int(0, 300) + (g.chance(0.3) ? 0.25 : 0),
			label: g.chance(0.1) ? '  ' : `Circuit ${i}`,
			roomIds,
			status: g.pick(['new', 'existing', 'modified', 'removed', 'new']),
			gfciAtDevice: g.chance(0.2),
			afciAtDevice: g.chance(0.1),
		});
		for (let j = 0; j < g.int(0, 5); j++) {
			const kind = g.pick(LOAD_KINDS);
			const rating = g.next();
			loads.push({
				id: `l${i}-${j}`,
				circuitId: id,
				kind,
				quantity: g.chance(0.2) ? g.int(2, 8) : 1,
				voltage: poles === 1 ? 120 : g.pick([120, threePhase ? 208 : 240, 208, 240]),
				continuous: g.chance(0.2),
				cordAndPlug: g.chance(0.3),
				roomIds: rooms.length > 0 && g.chance(0.6) ? [g.pick(rooms).id] : [],
				...(rating < 0.6
					? { va: g.int(50, 12000) + (g.chance(0.3) ? 0.5 : 0) }
					: rating < 0.85
						? { watts: g.int(50, 15000) }
						: { hp: g.pick(MOTOR_HP) }),
				...(g.chance(0.3) ? { status: g.pick(['new', 'existing']) } : {}),
				...(kind === 'hvac-heat' && g.chance(0.5) ? { spaceHeating: g.pick(SPACE_HEATING_TYPES) } : {}),
			});
		}
	}
	const singles = circuits.filter((c) => c.poles === 1);
	if (singles.length >= 2 && g.chance(0.4)) {
		const a = g.pick(singles);
		const b = g.pick(singles);
		if (a !== b) {
			a.multiwireWith = b.id;
			if (g.chance(0.7)) b.multiwireWith = a.id;
		}
	}
	return {
		formatVersion: 1,
		name: `Generated job ${n}`,
		codeEdition: g.pick(['2017', '2020', '2023']),
		terminalTemperatureC: g.pick([60, 75, 75, 90]),
		...(g.chance(0.1) ? { floorAreaFt2: g.int(500, 4000) } : {}),
		...(g.chance(0.5) ? { id: `job-${n}` } : {}),
		service: {
			ratingA: g.pick([60, 100, 125, 150, 200, 400]),
			voltageSystem: system,
			...(g.chance(0.3) ? { existingLoad: { method: 'measured-peak', peakDemandKW: g.int(2, 40) } } : {}),
		},
		rooms,
		panels,
		circuits,
		// Every third job lists its loads out of circuit order, as a hand-edited file may.
		loads: n % 3 === 0 ? loads.reverse() : loads,
	};
}

function fingerprint(name: string, input: unknown): string {
	const parsed = parseJobDocument(input);
	const text = parsed.ok ? JSON.stringify(computeJob(parsed.doc)) : `invalid: ${parsed.errors.join('\n')}`;
	return `${name} ${crypto.createHash('sha256').update(text).digest('hex')}`;
}

const lines: string[] = [];
for (const file of fs.readdirSync(path.join(root, 'examples')).sort())
	lines.push(fingerprint(file, JSON.parse(fs.readFileSync(path.join(root, 'examples', file), 'utf8'))));
lines.push(fingerprint('generated-2000', generatedJob(2000)));
lines.push(fingerprint('generated-10000', generatedJob(10_000)));
lines.push(fingerprint('large-default', largeJob()));
lines.push(fingerprint('large-84-spaces', largeJob({ circuits: 300, loads: 1500, rooms: 60, spaces: 84 })));
const g = generator(12345);
for (let n = 1; n <= 1500; n++) lines.push(fingerprint(`random-${n}`, randomJob(g, n)));
process.stdout.write(`${lines.join('\n')}\n`);

/**
 * Benchmark of the calculation engine: a generated job of 10,000 circuits and 40,000 loads.
 * Run through scripts/bench.ts (npm run bench) or directly: node --import tsx scripts/bench/engine.ts
 */
import { fileURLToPath } from 'node:url';
import { performance } from 'node:perf_hooks';
import { computeJob, parseJobDocument } from '../../src/lib/electrical/index';
import type { JobDocumentInput } from '../../src/lib/electrical/index';

export interface BenchFigure {
	name: string;
	medianMs: number;
	/** 95th percentile (nearest rank), where measured. */
	p95Ms?: number;
	/** Median CPU time of this process (user + system, all threads) per run, where measured: steadier than wall time on a busy machine. */
	cpuMedianMs?: number;
	minMs: number;
	maxMs: number;
	runs: number;
	targetMs?: number;
}

const KINDS = ['lighting', 'receptacles', 'small-appliance', 'fixed-appliance'] as const;

/** A job of `circuits` 1-pole circuits with four loads each, spread over 42-space subpanels under one main. */
export function generatedJob(circuits = 10_000): JobDocumentInput {
	const perPanel = 40;
	const panelCount = Math.ceil(circuits / perPanel);
	const panels: NonNullable<JobDocumentInput['panels']> = [
		{
			id: 'main',
			name: 'Main',
			kind: 'main',
			voltageSystem: '120/240-1ph-3w',
			busRatingA: 1200,
			mainBreakerA: 1200,
			spaces: 84,
		},
	];
	const list: NonNullable<JobDocumentInput['circuits']> = [];
	const loads: NonNullable<JobDocumentInput['loads']> = [];
	const rooms: NonNullable<JobDocumentInput['rooms']> = [];
	for (let r = 0; r < 200; r++) rooms.push({ id: `r${r}`, name: `Room ${r}`, type: 'bedroom', areaFt2: 150 });
	// Feeders hang from sub-distribution panels so every panel stays within its spaces.
	for (let d = 0; d < Math.ceil(panelCount / 20); d++) {
		panels.push({
			id: `dist${d}`,
			name: `Distribution ${d}`,
			kind: 'sub',
			fedFromCircuitId: `fd${d}`,
			voltageSystem: '120/240-1ph-3w',
			busRatingA: 1200,
			mainBreakerA: null,
			spaces: 84,
		});
		list.push({
			id: `fd${d}`,
			panelId: 'main',
			position: 1 + 4 * Math.floor(d / 2) + (d % 2),
			poles: 2,
			ratingA: 400,
			conductor: { size: '4/0', material: 'cu', insulationC: 75 },
			lengthFt: 30,
			label: `Distribution ${d}`,
		});
	}
	for (let p = 0; p < panelCount; p++) {
		const d = Math.floor(p / 20);
		const k = p % 20;
		panels.push({
			id: `p${p}`,
			name: `Panel ${p}`,
			kind: 'sub',
			fedFromCircuitId: `f${p}`,
			voltageSystem: '120/240-1ph-3w',
			busRatingA: 225,
			mainBreakerA: null,
			spaces: 42,
		});
		list.push({
			id: `f${p}`,
			panelId: `dist${d}`,
			position: 1 + 4 * Math.floor(k / 2) + (k % 2),
			poles: 2,
			ratingA: 200,
			conductor: { size: '3/0', material: 'cu', insulationC: 75 },
			lengthFt: 60,
			label: `Panel ${p} feeder`,
		});
	}
	for (let i = 0; i < circuits; i++) {
		const p = Math.floor(i / perPanel);
		const id = `c${i}`;
		const room = `r${i % 200}`;
		list.push({
			id,
			panelId: `p${p}`,
			position: (i % perPanel) + 1,
			poles: 1,
			ratingA: 20,
			breakerType: 'dual-function',
			conductor: { size: '12', material: 'cu', insulationC: 90 },
			lengthFt: 20 + (i % 60),
			label: `Circuit ${i}`,
			roomIds: [room],
		});
		for (let j = 0; j < 4; j++) {
			loads.push({
				id: `l${i}-${j}`,
				circuitId: id,
				kind: KINDS[(i + j) % 4] as (typeof KINDS)[number],
				va: 100 + ((i * 7 + j * 13) % 300),
				voltage: 120,
				roomIds: [room],
			});
		}
	}
	return {
		formatVersion: 1,
		name: 'Benchmark',
		codeEdition: '2023',
		service: { ratingA: 1200, voltageSystem: '120/240-1ph-3w' },
		rooms,
		panels,
		circuits: list,
		loads,
	};
}

function median(xs: number[]): number {
	const s = [...xs].sort((a, b) => a - b);
	const m = Math.floor(s.length / 2);
	return s.length % 2 === 1 ? (s[m] as number) : ((s[m - 1] as number) + (s[m] as number)) / 2;
}

function percentile(xs: number[], p: number): number {
	const s = [...xs].sort((a, b) => a - b);
	return s[Math.min(s.length - 1, Math.max(0, Math.ceil((p / 100) * s.length) - 1))] as number;
}

const ms = (x: number) => Math.round(x * 100) / 100;

/**
 * Median, p95, min and max of `runs` timed calls after `warmup` untimed ones (the JIT and the heap
 * settle), with the median CPU time per call.
 */
function time(name: string, runs: number, fn: () => void, targetMs?: number, warmup = 20): BenchFigure {
	for (let i = 0; i < warmup; i++) fn();
	const t: number[] = [];
	const cpu: number[] = [];
	for (let i = 0; i < runs; i++) {
		const c = process.cpuUsage();
		const a = performance.now();
		fn();
		t.push(performance.now() - a);
		const d = process.cpuUsage(c);
		cpu.push((d.user + d.system) / 1000);
	}
	const p95 = ms(percentile(t, 95));
	const cpuMedian = ms(median(cpu));
	const f: BenchFigure = {
		// scripts/bench.ts prints name, median, min and max: p95 and CPU go in the name so they are printed too.
		name: `${name} [p95 ${p95} ms, CPU median ${cpuMedian} ms]`,
		medianMs: ms(median(t)),
		p95Ms: p95,
		cpuMedianMs: cpuMedian,
		minMs: ms(Math.min(...t)),
		maxMs: ms(Math.max(...t)),
		runs,
	};
	if (targetMs !== undefined) f.targetMs = targetMs;
	return f;
}

/** computeJob on the generated job, already parsed. */
function benchCompute(): BenchFigure {
	const parsed = parseJobDocument(generatedJob(10_000));
	if (!parsed.ok) throw new Error(parsed.errors.slice(0, 5).join('\n'));
	const doc = parsed.doc;
	if (doc.circuits.length < 10_000 || doc.loads.length !== 40_000)
		throw new Error('generated job has the wrong size');
	return time('engine: computeJob, 10,000 circuits / 40,000 loads', 30, () => void computeJob(doc), 50);
}

/**
 * Times computeJob on the generated job, already parsed, and parsing on its own (without a
 * target); returns one figure per measurement. Each measurement keeps only its own job alive, so
 * that one job's objects do not weigh on the other measurement's garbage collection.
 */
export async function benchEngine(): Promise<BenchFigure[]> {
	const compute = benchCompute();
	const input = generatedJob(10_000);
	const parse = time(
		'engine: parseJobDocument, same job',
		5,
		() => void parseJobDocument(input),
		undefined,
		2,
	);
	return [compute, parse];
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
	for (const f of await benchEngine()) {
		process.stdout.write(
			`${f.name}: median ${f.medianMs} ms, min ${f.minMs}, max ${f.maxMs} over ${f.runs} runs` +
				(f.targetMs === undefined
					? '\n'
					: `  (target < ${f.targetMs} ms: ${f.medianMs < f.targetMs ? 'met' : 'MISSED'})\n`),
		);
	}
}

/**
 * Documents benchmark: the permit packet and a panel schedule of a generated large job (3 panels,
 * 90 circuits, 400 loads, 30 rooms, 6 PNG sketches of 2000 × 1500 and 2 ten-page PDF sketches),
 * and the process's memory after garbage collection at packet render 20 and 200.
 * Run through scripts/bench.ts (npm run bench) or directly: node --import tsx scripts/bench/documents.ts
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { fileURLToPath } from 'node:url';
import v8 from 'node:v8';
import vm from 'node:vm';
import { documentData, permitTypeOf } from '../../src/lib/documents/data';
import { renderDirectoryCard } from '../../src/lib/documents/render-directory-card';
import { renderPacket } from '../../src/lib/documents/render-packet';
import { renderPanelSchedule } from '../../src/lib/documents/render-panel-schedule';
import type { DocumentData } from '../../src/lib/documents/types';
import { layoutRecessedLights } from '../../src/lib/electrical';
import type { BenchFigure } from './engine';
import { benchSketches, largeJob } from './large-job';

const MB = 1024 * 1024;

function gcNow(): () => void {
	if (typeof globalThis.gc === 'function') return globalThis.gc;
	// The same switch as node --expose-gc, turned on from inside the process.
	v8.setFlagsFromString('--expose-gc');
	return vm.runInNewContext('gc') as () => void;
}

function figure(name: string, times: number[], targetMs?: number): BenchFigure {
	const sorted = [...times].sort((a, b) => a - b);
	const mid = Math.floor(sorted.length / 2);
	const median = sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
	const r = (v: number) => Math.round(v * 10) / 10;
	return {
		name,
		medianMs: r(median),
		minMs: r(sorted[0]!),
		maxMs: r(sorted[sorted.length - 1]!),
		runs: times.length,
		targetMs,
	};
}

async function time(fn: () => Promise<unknown>, runs: number): Promise<number[]> {
	const out: number[] = [];
	for (let i = 0; i < runs; i++) {
		const t = performance.now();
		await fn();
		out.push(performance.now() - t);
	}
	return out;
}

/** The large job's document data, its sketches written to a temporary folder. */
export async function benchDocumentData(dir: string): Promise<DocumentData> {
	const doc = largeJob();
	const input = {
		lengthFt: 16,
		widthFt: 12,
		ceilingHeightFt: 9,
		fixtureDiameterIn: 6,
		joists: { direction: 'along-width' as const, spacingIn: 16, firstOffsetIn: 8 },
	};
	const layout = layoutRecessedLights(input);
	return documentData({
		doc,
		job: {
			name: doc.name,
			address: doc.address,
			homeownerName: 'Bettany Roe',
			homeownerEmail: 'bettany.roe@mail.example',
			permitNumber: 'QC-E-2026-0999',
			scopeOfWork: 'Rewire the whole house: new 200 A service panel, two subpanels, 88 branch circuits.',
			permitType: permitTypeOf(doc),
		},
		firm: {
			name: 'Tallowmere Electric Co.',
			licenceNumber: 'EC-40917',
			phone: '555-0142',
			address: '18 Kettleby Row, Quillmere',
		},
		jurisdiction: { name: 'Quillmere County Building Division', address: '2 Civic Loop, Quillmere' },
		revision: 12,
		draft: false,
		date: new Date().toISOString().slice(0, 10),
		sketches: await benchSketches(dir),
		layouts: layout.ok
			? [{ title: 'Recessed lights', roomName: 'Kitchen 1', input, layout: layout.layout }]
			: [],
		mapUrl: 'https://ampledger.example/map/benchmark-link-0000000000000000',
	});
}

/** Runs the documents benchmark; prints memory figures as it goes. */
export async function benchDocuments(): Promise<BenchFigure[]> {
	const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'ampledger-bench-documents-'));
	try {
		const data = await benchDocumentData(dir);
		const panelId = data.doc.panels[0]!.id;
		const gc = gcNow();
		// Warm-up: fonts, the layout engine's wasm, JIT.
		await renderPacket(data);
		await renderPanelSchedule(data, panelId);
		const packetBytes = (await renderPacket(data)).byteLength;
		const figures = [
			figure('documents: permit packet (large job)', await time(() => renderPacket(data), 15), 2000),
			figure(
				'documents: panel schedule (42 positions)',
				await time(() => renderPanelSchedule(data, panelId), 30),
				300,
			),
			figure('documents: directory card', await time(() => renderDirectoryCard(data, panelId), 20)),
		];
		process.stdout.write(`documents: packet is ${Math.round(packetBytes / 1024)} KB\n`);

		const total = Number(process.env.BENCH_PACKET_RENDERS ?? 200);
		const memory: { at: number; heapMB: number; rssMB: number }[] = [];
		for (let i = 1; i <= total; i++) {
			await renderPacket(data);
			if (i === 20 || i === total) {
				gc();
				await new Promise((r) => setTimeout(r, 50));
				gc();
				const m = process.memoryUsage();
				memory.push({
					at: i,
					heapMB: Math.round((m.heapUsed / MB) * 10) / 10,
					rssMB: Math.round((m.rss / MB) * 10) / 10,
				});
			}
		}
		for (const m of memory)
			process.stdout.write(
				`documents: after ${m.at} packet renders (GC): heapUsed ${m.heapMB} MB, rss ${m.rssMB} MB\n`,
			);
		if (memory.length === 2) {
			const growth = memory[1]!.heapMB - memory[0]!.heapMB;
			process.stdout.write(
				`documents: heap growth from render 20 to ${total}: ${growth.toFixed(1)} MB (${growth < 20 ? 'steady' : 'GROWING'})\n`,
			);
		}
		return figures;
	} finally {
		fs.rmSync(dir, { recursive: true, force: true });
	}
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
	for (const f of await benchDocuments())
		process.stdout.write(
			`${f.name}: median ${f.medianMs} ms, min ${f.minMs}, max ${f.maxMs} over ${f.runs} runs\n`,
		);
}

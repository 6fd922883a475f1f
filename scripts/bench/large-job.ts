/** A generated large job for the documents benchmark and tests: invented data, sized like a big remodel. */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { PDFDocument, StandardFonts, rgb } from 'pdf-lib';
import sharp from 'sharp';
import {
	ROOM_TYPES as ALL_ROOM_TYPES,
	jobDocumentSchema,
	type JobDocument,
	type JobDocumentInput,
} from '../../src/lib/electrical';
import type { SketchSource } from '../../src/lib/documents/types';

/** The schema's room types, less those that count for little in a remodel's rooms. */
const ROOM_TYPES = ALL_ROOM_TYPES.filter(
	(t) => t !== 'outdoor' && t !== 'attic' && t !== 'crawl-space' && t !== 'other',
);
const WORDS = [
	'north wall',
	'island',
	'vanity',
	'closet',
	'ceiling fan',
	'bench',
	'east window',
	'landing',
	'built-ins',
	'patio door',
];

/** A job document with `panels` panelboards (main + subs), `circuits` circuits, `loads` loads and `rooms` rooms. */
export function largeJob(
	opts: { circuits?: number; loads?: number; rooms?: number; spaces?: number; labelLength?: number } = {},
): JobDocument {
	const circuitsWanted = opts.circuits ?? 90;
	const loadsWanted = opts.loads ?? 400;
	const roomCount = opts.rooms ?? 30;
	const spaces = opts.spaces ?? 42;
	const rooms = Array.from({ length: roomCount }, (_, i) => ({
		id: `room-${i + 1}`,
		name: `${ROOM_TYPES[i % ROOM_TYPES.length]!.replace(/^./, (c) => c.toUpperCase())} ${Math.floor(i / ROOM_TYPES.length) + 1}`,
		type: ROOM_TYPES[i % ROOM_TYPES.length]!,
		floor: 1 + (i % 2),
		areaFt2: 80 + ((i * 37) % 160),
	}));
	const panels: JobDocumentInput['panels'] = [
		{
			id: 'panel-main',
			name: 'Main',
			location: 'Garage, east wall',
			kind: 'main',
			voltageSystem: '120/240-1ph-3w',
			busRatingA: 225,
			mainBreakerA: 200,
			spaces,
		},
		{
			id: 'panel-sub-a',
			name: 'Sub A',
			location: 'Basement stair',
			kind: 'sub',
			fedFromCircuitId: 'feeder-a',
			voltageSystem: '120/240-1ph-3w',
			busRatingA: 125,
			mainBreakerA: null,
			spaces,
		},
		{
			id: 'panel-sub-b',
			name: 'Sub B',
			location: 'Second-floor hall closet',
			kind: 'sub',
			fedFromCircuitId: 'feeder-b',
			voltageSystem: '120/240-1ph-3w',
			busRatingA: 125,
			mainBreakerA: null,
			spaces,
		},
	];
	const circuits: JobDocumentInput['circuits'] = [
		{
			id: 'feeder-a',
			panelId: 'panel-main',
			position: 1,
			poles: 2,
			ratingA: 100,
			breakerType: 'standard',
			conductor: { size: '3', material: 'cu', insulationC: 75 },
			lengthFt: 40,
			label: 'Feeder to Sub A (basement)',
			status: 'new',
		},
		{
			id: 'feeder-b',
			panelId: 'panel-main',
			position: 2,
			poles: 2,
			ratingA: 100,
			breakerType: 'standard',
			conductor: { size: '3', material: 'cu', insulationC: 75 },
			lengthFt: 55,
			label: 'Feeder to Sub B (second floor)',
			status: 'new',
		},
	];
	const branch = circuitsWanted - 2;
	const perPanel = [Math.ceil(branch / 3), Math.ceil(branch / 3), branch - 2 * Math.ceil(branch / 3)];
	let k = 0;
	panels.forEach((p, pi) => {
		const start = pi === 0 ? 5 : 1;
		for (let i = 0; i < perPanel[pi]! && start + i <= spaces; i++) {
			k++;
			const room = rooms[k % rooms.length]!;
			const other = rooms[(k * 7) % rooms.length]!;
			let label = `${room.name} ${WORDS[k % WORDS.length]} receptacles and lights`;
			if (opts.labelLength) label = (label + ' ' + WORDS.join(' ')).slice(0, opts.labelLength);
			circuits.push({
				id: `c-${k}`,
				panelId: p.id,
				position: start + i,
				poles: 1,
				ratingA: 20,
				breakerType: k % 3 === 0 ? 'dual-function' : k % 3 === 1 ? 'afci' : 'gfci',
				conductor: { size: '12', material: 'cu', insulationC: 90 },
				lengthFt: 30 + (k % 40),
				label: k % 17 === 0 ? 'Spare' : label,
				roomIds: k % 17 === 0 ? [] : [room.id, other.id].filter((v, idx, a) => a.indexOf(v) === idx),
				status: k % 5 === 0 ? 'existing' : 'new',
			});
		}
	});
	const branchIds = circuits.filter((c) => !c.id.startsWith('feeder') && c.label !== 'Spare');
	const loads: JobDocumentInput['loads'] = Array.from({ length: loadsWanted }, (_, i) => {
		const c = branchIds[i % branchIds.length]!;
		const dishwasher = i % 50 === 7;
		return {
			id: `l-${i + 1}`,
			circuitId: c.id,
			kind: dishwasher ? 'fixed-appliance' : i % 2 ? 'receptacles' : 'lighting',
			description: dishwasher ? 'Dishwasher' : i % 2 ? 'Duplex receptacle' : 'Recessed light',
			quantity: 1,
			va: dishwasher ? 1200 : i % 2 ? 180 : 60,
			voltage: 120,
			roomIds: c.roomIds?.slice(0, 1) ?? [],
		};
	});
	return jobDocumentSchema.parse({
		formatVersion: 1,
		id: 'job-large-bench',
		name: 'Wexcombe house: whole-home rewire with two subpanels',
		address: '88 Larkspur Turn, Quillmere',
		codeEdition: '2023',
		service: { ratingA: 200, voltageSystem: '120/240-1ph-3w' },
		rooms,
		panels,
		circuits,
		loads,
	});
}

function planSvg(width: number, height: number, title: string): string {
	const walls: string[] = [];
	for (let i = 1; i < 6; i++)
		walls.push(
			`<line x1="${(width / 6) * i}" y1="60" x2="${(width / 6) * i}" y2="${height - 60}" stroke="#333" stroke-width="6"/>`,
		);
	for (let i = 1; i < 4; i++)
		walls.push(
			`<line x1="60" y1="${(height / 4) * i}" x2="${width - 60}" y2="${(height / 4) * i}" stroke="#333" stroke-width="4"/>`,
		);
	for (let i = 0; i < 80; i++)
		walls.push(
			`<circle cx="${100 + ((i * 211) % (width - 200))}" cy="${100 + ((i * 137) % (height - 200))}" r="14" fill="none" stroke="#a0522d" stroke-width="3"/>`,
		);
	return `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}">
		<rect width="100%" height="100%" fill="#fbfaf7"/>
		<rect x="60" y="60" width="${width - 120}" height="${height - 120}" fill="none" stroke="#111" stroke-width="12"/>
		${walls.join('')}
		<text x="90" y="130" font-size="64" font-family="sans-serif">${title}</text>
	</svg>`;
}

/** Writes 6 PNG plans (2000 × 1500) and 2 ten-page PDF plans into a folder and describes them as sketches. */
export async function benchSketches(
	dir = fs.mkdtempSync(path.join(os.tmpdir(), 'ampledger-bench-sketches-')),
	pngCount = 6,
	pdfCount = 2,
	pdfPages = 10,
): Promise<SketchSource[]> {
	fs.mkdirSync(dir, { recursive: true });
	const out: SketchSource[] = [];
	for (let i = 0; i < pngCount; i++) {
		const file = path.join(dir, `plan-${i + 1}.png`);
		if (!fs.existsSync(file))
			await sharp(Buffer.from(planSvg(2000, 1500, `Floor plan ${i + 1}`)))
				.png()
				.toFile(file);
		out.push({
			id: `png-${i + 1}`,
			caption: `Floor plan ${i + 1}, circuits marked`,
			originalName: `plan-${i + 1}.png`,
			contentType: 'image/png',
			path: file,
			roomName: i === 0 ? 'Kitchen 1' : null,
		});
	}
	for (let i = 0; i < pdfCount; i++) {
		const file = path.join(dir, `drawings-${i + 1}.pdf`);
		if (!fs.existsSync(file)) {
			const doc = await PDFDocument.create();
			const font = await doc.embedFont(StandardFonts.Helvetica);
			for (let p = 0; p < pdfPages; p++) {
				const page = doc.addPage([792, 612]);
				page.drawRectangle({
					x: 40,
					y: 40,
					width: 712,
					height: 532,
					borderWidth: 3,
					borderColor: rgb(0.1, 0.1, 0.1),
				});
				for (let l = 0; l < 12; l++)
					page.drawLine({ start: { x: 40 + l * 60, y: 40 }, end: { x: 40 + l * 60, y: 572 }, thickness: 1 });
				page.drawText(`Drawing set ${i + 1}, page ${p + 1}`, { x: 60, y: 540, size: 20, font });
			}
			fs.writeFileSync(file, await doc.save());
		}
		out.push({
			id: `pdf-${i + 1}`,
			caption: `Electrical drawings set ${i + 1}`,
			originalName: `drawings-${i + 1}.pdf`,
			contentType: 'application/pdf',
			path: file,
			roomName: null,
		});
	}
	return out;
}

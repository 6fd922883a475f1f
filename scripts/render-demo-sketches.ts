// Draws the demo job's two floor-plan sketches (an invented house) as SVG and renders them to
// seeds/data/sketches/*.png with sharp. Run: node --import tsx scripts/render-demo-sketches.ts
import fs from 'node:fs';
import path from 'node:path';
import sharp from 'sharp';

interface Room {
	name: string;
	x: number;
	y: number;
	w: number;
	h: number;
	note?: string;
	/** Outdoor or open areas are drawn dashed. */
	dashed?: boolean;
}
interface Mark {
	label: string;
	x: number;
	y: number;
	/** Which side of the symbol the label goes. */
	side?: 'left' | 'right';
	kind?: 'panel' | 'equipment';
}
interface Sheet {
	file: string;
	title: string;
	rooms: Room[];
	/** Door openings as wall gaps with a swing: at (x, y), width in feet, along 'h' or 'v' walls. */
	doors: { x: number; y: number; w: number; along: 'h' | 'v' }[];
	windows: { x: number; y: number; w: number; along: 'h' | 'v' }[];
	/** Wide openings without a swing (a garage door), drawn dashed. */
	openings?: { x: number; y: number; w: number }[];
	/** Ceiling light positions (recessed fixtures). */
	lights?: { x: number; y: number }[];
	marks: Mark[];
}

const SCALE = 24; // pixels per foot
const MARGIN = 90;
const ADDRESS = '417 Fenwick Reach Road, Quillmere';
const FIRM = 'Tallowmere Electric Co.';

const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;');
const px = (ft: number) => MARGIN + ft * SCALE;

function draw(sheet: Sheet): string {
	const maxX = Math.max(...sheet.rooms.map((r) => r.x + r.w));
	const maxY = Math.max(...sheet.rooms.map((r) => r.y + r.h));
	const width = Math.max(px(maxX) + MARGIN + 120, 1200);
	const height = px(maxY) + MARGIN + 170;
	const parts: string[] = [];
	const add = (svg: string) => parts.push(svg);
	add(`<rect width="${width}" height="${height}" fill="#fbfaf6"/>`);
	// A light grid of 2 ft squares, like the squared paper such sketches are drawn on.
	for (let x = MARGIN; x <= width - MARGIN; x += SCALE * 2) {
		add(`<line x1="${x}" y1="${MARGIN - 30}" x2="${x}" y2="${height - 150}" stroke="#e6e2d6"/>`);
	}
	for (let y = MARGIN - 30; y <= height - 150; y += SCALE * 2) {
		add(`<line x1="${MARGIN}" y1="${y}" x2="${width - MARGIN}" y2="${y}" stroke="#e6e2d6"/>`);
	}
	for (const r of sheet.rooms) {
		const stroke = r.dashed ? 'stroke-width="3" stroke-dasharray="12 8"' : 'stroke-width="6"';
		add(
			`<rect x="${px(r.x)}" y="${px(r.y)}" width="${r.w * SCALE}" height="${r.h * SCALE}" fill="none" stroke="#1f2933" ${stroke}/>`,
		);
	}
	for (const d of sheet.doors) {
		const x = px(d.x);
		const y = px(d.y);
		const w = d.w * SCALE;
		if (d.along === 'h') {
			add(`<line x1="${x}" y1="${y}" x2="${x + w}" y2="${y}" stroke="#fbfaf6" stroke-width="9"/>`);
			add(
				`<path d="M ${x} ${y} L ${x} ${y + w} A ${w} ${w} 0 0 0 ${x + w} ${y}" fill="none" stroke="#52606d" stroke-width="2"/>`,
			);
		} else {
			add(`<line x1="${x}" y1="${y}" x2="${x}" y2="${y + w}" stroke="#fbfaf6" stroke-width="9"/>`);
			add(
				`<path d="M ${x} ${y} L ${x + w} ${y} A ${w} ${w} 0 0 1 ${x} ${y + w}" fill="none" stroke="#52606d" stroke-width="2"/>`,
			);
		}
	}
	for (const win of sheet.windows) {
		const x = px(win.x);
		const y = px(win.y);
		const [x2, y2] = win.along === 'h' ? [x + win.w * SCALE, y] : [x, y + win.w * SCALE];
		add(`<line x1="${x}" y1="${y}" x2="${x2}" y2="${y2}" stroke="#fbfaf6" stroke-width="9"/>`);
		add(`<line x1="${x}" y1="${y}" x2="${x2}" y2="${y2}" stroke="#3e7cb1" stroke-width="3"/>`);
	}
	for (const o of sheet.openings ?? []) {
		const x = px(o.x);
		const y = px(o.y);
		const x2 = x + o.w * SCALE;
		add(`<line x1="${x}" y1="${y}" x2="${x2}" y2="${y}" stroke="#fbfaf6" stroke-width="9"/>`);
		add(
			`<line x1="${x}" y1="${y}" x2="${x2}" y2="${y}" stroke="#52606d" stroke-width="2" stroke-dasharray="10 6"/>`,
		);
	}
	for (const l of sheet.lights ?? []) {
		add(`<circle cx="${px(l.x)}" cy="${px(l.y)}" r="9" fill="#fff" stroke="#c2410c" stroke-width="3"/>`);
		add(`<circle cx="${px(l.x)}" cy="${px(l.y)}" r="3" fill="#c2410c"/>`);
	}
	for (const r of sheet.rooms) {
		const cx = px(r.x + r.w / 2);
		const cy = px(r.y + r.h / 2);
		const size = r.w < 5 ? 12 : r.w < 6 ? 14 : r.w < 9 || r.h < 6 ? 18 : 24;
		add(
			`<text x="${cx}" y="${cy - 4}" font-size="${size}" font-weight="700" text-anchor="middle" fill="#1f2933">${esc(r.name)}</text>`,
		);
		add(
			`<text x="${cx}" y="${cy + 20}" font-size="15" text-anchor="middle" fill="#52606d">${r.w}′ × ${r.h}′</text>`,
		);
		if (r.note) {
			add(
				`<text x="${cx}" y="${cy + 40}" font-size="14" font-style="italic" text-anchor="middle" fill="#9a5b13">${esc(r.note)}</text>`,
			);
		}
	}
	for (const m of sheet.marks) {
		const x = px(m.x);
		const y = px(m.y);
		const equipment = m.kind === 'equipment';
		add(
			equipment
				? `<circle cx="${x}" cy="${y}" r="13" fill="#cbd2d9" stroke="#1f2933" stroke-width="2"/>`
				: `<rect x="${x - 14}" y="${y - 9}" width="28" height="18" fill="#c2410c" stroke="#1f2933" stroke-width="2"/>`,
		);
		const left = m.side === 'left';
		add(
			`<text x="${left ? x - 22 : x + 22}" y="${y + 5}" font-size="15" font-weight="700" text-anchor="${left ? 'end' : 'start'}" fill="${equipment ? '#3e4c59' : '#c2410c'}">${esc(m.label)}</text>`,
		);
	}
	// North arrow and scale bar.
	const nx = width - MARGIN - 10;
	parts.push(
		`<path d="M ${nx} ${MARGIN - 10} l -14 40 l 14 -10 l 14 10 z" fill="#1f2933"/><text x="${nx}" y="${MARGIN + 52}" font-size="18" font-weight="700" text-anchor="middle">N</text>`,
	);
	const sy = height - 140;
	parts.push(
		`<line x1="${MARGIN}" y1="${sy}" x2="${MARGIN + 10 * SCALE}" y2="${sy}" stroke="#1f2933" stroke-width="4"/>`,
	);
	parts.push(
		`<text x="${MARGIN}" y="${sy + 24}" font-size="15" fill="#52606d">0</text><text x="${MARGIN + 10 * SCALE}" y="${sy + 24}" font-size="15" text-anchor="middle" fill="#52606d">10 ft</text>`,
	);
	// Title block.
	const ty = height - 70;
	parts.push(
		`<rect x="${MARGIN}" y="${ty - 28}" width="${width - 2 * MARGIN}" height="62" fill="#fff" stroke="#1f2933" stroke-width="2"/>`,
	);
	parts.push(
		`<text x="${MARGIN + 16}" y="${ty}" font-size="22" font-weight="700" fill="#1f2933">${esc(sheet.title)}</text>`,
	);
	parts.push(
		`<text x="${MARGIN + 16}" y="${ty + 24}" font-size="15" fill="#52606d">${esc(ADDRESS)} · drawn by ${esc(FIRM)} · field sketch, dimensions approximate</text>`,
	);
	return `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" font-family="DejaVu Sans, sans-serif">${parts.join('\n')}</svg>`;
}

// The rooms and areas of the demo job (seeds/data/demo-job.ts): first floor with the garage, and the basement.
const kitchenLights = [2, 6, 10, 14].flatMap((y) => [32.5, 41.5].map((x) => ({ x, y })));

const sheets: Sheet[] = [
	{
		file: 'first-floor.png',
		title: 'First floor plan with garage',
		rooms: [
			{ name: 'Living room', x: 0, y: 0, w: 20, h: 16 },
			{ name: 'Dining room', x: 20, y: 0, w: 10, h: 16 },
			{ name: 'Kitchen', x: 30, y: 0, w: 14, h: 16, note: 'remodel: 8 recessed lights' },
			{ name: 'Entry hall', x: 0, y: 16, w: 9, h: 10 },
			{ name: 'Powder room', x: 9, y: 16, w: 4, h: 10 },
			{ name: 'Stair', x: 13, y: 16, w: 4, h: 10 },
			{ name: 'Laundry', x: 17, y: 16, w: 6, h: 10 },
			{ name: 'Garage', x: 23, y: 16, w: 24, h: 20, note: 'EV charger (new, 48 A)' },
			{ name: 'Porch', x: 0, y: 26, w: 9, h: 7, dashed: true },
		],
		doors: [
			{ x: 3, y: 26, w: 3, along: 'h' },
			{ x: 9, y: 22, w: 2.5, along: 'v' },
			{ x: 18, y: 16, w: 3, along: 'h' },
			{ x: 23, y: 19, w: 3, along: 'v' },
			{ x: 38, y: 16, w: 3, along: 'h' },
		],
		windows: [
			{ x: 4, y: 0, w: 6, along: 'h' },
			{ x: 22, y: 0, w: 5, along: 'h' },
			{ x: 34, y: 0, w: 5, along: 'h' },
			{ x: 0, y: 4, w: 6, along: 'v' },
			{ x: 44, y: 5, w: 5, along: 'v' },
		],
		openings: [{ x: 27, y: 36, w: 16 }],
		lights: kitchenLights,
		marks: [
			{ label: 'Garage subpanel', x: 46.4, y: 22, side: 'left' },
			{ label: 'EV charger', x: 46.4, y: 31, side: 'left', kind: 'equipment' },
		],
	},
	{
		file: 'basement.png',
		title: 'Basement plan',
		rooms: [
			{ name: 'Basement', x: 0, y: 0, w: 30, h: 20, note: 'unfinished; not counted in floor area' },
			{ name: 'Stair', x: 8, y: 12, w: 4, h: 8 },
		],
		doors: [],
		windows: [
			{ x: 3, y: 20, w: 4, along: 'h' },
			{ x: 22, y: 20, w: 4, along: 'h' },
		],
		marks: [
			{ label: 'Main panel, 200 A (north wall)', x: 5, y: 0.6 },
			{ label: 'Water heater', x: 24, y: 4, kind: 'equipment' },
			{ label: 'Furnace', x: 24, y: 9, kind: 'equipment' },
		],
	},
];

const out = path.resolve(import.meta.dirname, '..', 'seeds', 'data', 'sketches');
fs.mkdirSync(out, { recursive: true });
for (const sheet of sheets) {
	const file = path.join(out, sheet.file);
	await sharp(Buffer.from(draw(sheet)))
		.png({ palette: true, colours: 64 })
		.toFile(file);
	console.log(`${file} (${fs.statSync(file).size} bytes)`);
}

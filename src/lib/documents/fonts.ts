/**
 * Noto Sans from the app's own node_modules (never the network): registered with react-pdf for the
 * templates, opened with fontkit to measure text for pagination, and embedded by pdf-lib for footers.
 */
import fs from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import zlib from 'node:zlib';
import fontkit from '@pdf-lib/fontkit';
import { Font } from '@react-pdf/renderer';
import type { PDFDocument, PDFFont } from 'pdf-lib';

export const FONT = 'NotoSans';
export const FONT_EXT = 'NotoSansExt';
/** fontFamily for every style: latin first, latin-ext (Ł, Ő, ...) where latin has no glyph. */
export const FONT_FAMILY = [FONT, FONT_EXT];

type Weight = 400 | 700;
type Subset = 'latin' | 'latin-ext';

function filesDir(): string {
	try {
		const require = createRequire(import.meta.url);
		return path.join(path.dirname(require.resolve('@fontsource/noto-sans/package.json')), 'files');
	} catch {
		return path.join(process.cwd(), 'node_modules', '@fontsource', 'noto-sans', 'files');
	}
}

/**
 * Unpacks a WOFF 1.0 file into the TrueType font it wraps (each table is zlib-deflated). Done once
 * per face with node's zlib; fontkit would otherwise inflate the tables in JavaScript on every open.
 */
export function woffToSfnt(woff: Buffer): Buffer {
	if (woff.readUInt32BE(0) !== 0x774f4646) throw new Error('not a WOFF file');
	const flavor = woff.readUInt32BE(4);
	const numTables = woff.readUInt16BE(12);
	const tables: { tag: number; checksum: number; data: Buffer }[] = [];
	for (let i = 0; i < numTables; i++) {
		const at = 44 + i * 20;
		const tag = woff.readUInt32BE(at);
		const offset = woff.readUInt32BE(at + 4);
		const compLength = woff.readUInt32BE(at + 8);
		const origLength = woff.readUInt32BE(at + 12);
		const checksum = woff.readUInt32BE(at + 16);
		const raw = woff.subarray(offset, offset + compLength);
		tables.push({ tag, checksum, data: compLength < origLength ? zlib.inflateSync(raw) : Buffer.from(raw) });
	}
	let searchRange = 1;
	let entrySelector = 0;
	while (searchRange * 2 <= numTables) {
		searchRange *= 2;
		entrySelector++;
	}
	const headerSize = 12 + 16 * numTables;
	const size = tables.reduce((n, t) => n + ((t.data.length + 3) & ~3), headerSize);
	const out = Buffer.alloc(size);
	out.writeUInt32BE(flavor, 0);
	out.writeUInt16BE(numTables, 4);
	out.writeUInt16BE(searchRange * 16, 6);
	out.writeUInt16BE(entrySelector, 8);
	out.writeUInt16BE(numTables * 16 - searchRange * 16, 10);
	let offset = headerSize;
	tables.forEach((t, i) => {
		const at = 12 + i * 16;
		out.writeUInt32BE(t.tag, at);
		out.writeUInt32BE(t.checksum, at + 4);
		out.writeUInt32BE(offset, at + 8);
		out.writeUInt32BE(t.data.length, at + 12);
		t.data.copy(out, offset);
		offset += (t.data.length + 3) & ~3;
	});
	return out;
}

const bytesCache = new Map<string, Buffer>();

/**
 * A face of Noto Sans as TrueType bytes, unpacked from the package's .woff file (react-pdf and
 * pdf-lib take the .woff too, but every open would inflate it again).
 */
export function fontBytes(subset: Subset, weight: Weight): Buffer {
	const key = `${subset}-${weight}`;
	let bytes = bytesCache.get(key);
	if (!bytes) {
		bytes = woffToSfnt(fs.readFileSync(path.join(filesDir(), `noto-sans-${subset}-${weight}-normal.woff`)));
		bytesCache.set(key, bytes);
	}
	return bytes;
}

let registered = false;

/** Registers Noto Sans with react-pdf from files on disk (data URLs, so nothing is fetched). */
export function registerFonts(): void {
	if (registered) return;
	const src = (subset: Subset, weight: Weight) =>
		`data:font/ttf;base64,${fontBytes(subset, weight).toString('base64')}`;
	for (const [family, subset] of [
		[FONT, 'latin'],
		[FONT_EXT, 'latin-ext'],
	] as const) {
		Font.register({
			family,
			fonts: [
				{ src: src(subset, 400), fontWeight: 400 },
				{ src: src(subset, 700), fontWeight: 700 },
			],
		});
	}
	// Words are wrapped at spaces and hyphens only; no hyphenation dictionary is loaded.
	Font.registerHyphenationCallback((word) => [word]);
	registered = true;
}

interface Metrics {
	unitsPerEm: number;
	widths: Map<number, number>;
	font: ReturnType<typeof fontkit.create>;
}
const metrics = new Map<string, Metrics>();

function metricsFor(subset: Subset, weight: Weight): Metrics {
	const key = `${subset}-${weight}`;
	let m = metrics.get(key);
	if (!m) {
		const font = fontkit.create(fontBytes(subset, weight));
		m = { unitsPerEm: font.unitsPerEm, widths: new Map(), font };
		metrics.set(key, m);
	}
	return m;
}

const faces: Record<Weight, Metrics[] | undefined> = { 400: undefined, 700: undefined };

function advance(cp: number, weight: Weight): number {
	return glyphWidth(cp, weight) ?? 0.6;
}

/** Advance width in em of the first face having the glyph, or null when neither has it. */
function glyphWidth(cp: number, weight: Weight): number | null {
	const list = (faces[weight] ??= [metricsFor('latin', weight), metricsFor('latin-ext', weight)]);
	for (const m of list) {
		let w = m.widths.get(cp);
		if (w === undefined) {
			const glyph = m.font.glyphForCodePoint(cp);
			w = glyph.id === 0 ? -1 : glyph.advanceWidth / m.unitsPerEm;
			m.widths.set(cp, w);
		}
		if (w >= 0) return w;
	}
	return null;
}

function covered(cp: number): boolean {
	return glyphWidth(cp, 400) !== null;
}

/** Whether the latin file has a glyph for a code point (otherwise latin-ext is used). */
export function latinHas(cp: number): boolean {
	const m = metricsFor('latin', 400);
	let w = m.widths.get(cp);
	if (w === undefined) {
		const glyph = m.font.glyphForCodePoint(cp);
		w = glyph.id === 0 ? -1 : glyph.advanceWidth / m.unitsPerEm;
		m.widths.set(cp, w);
	}
	return w >= 0;
}

const SUBSTITUTES: Record<string, string> = {
	'→': '->',
	'←': '<-',
	'≤': '<=',
	'≥': '>=',
	'≈': '~',
	'≠': '!=',
	'√': 'sqrt',
	'∑': 'sum',
	φ: 'ph',
	Ω: 'ohm',
};

/** A text with the characters neither Noto Sans subset has (arrows, some math signs) spelled in ASCII. */
export function printable(text: string): string {
	let out = '';
	for (const ch of text) {
		const cp = ch.codePointAt(0)!;
		if (cp < 0x80 || covered(cp)) out += ch;
		else out += SUBSTITUTES[ch] ?? '?';
	}
	return out;
}

/** Width of a text in points at a font size, as Noto Sans sets it. */
export function textWidth(text: string, size: number, weight: Weight = 400): number {
	let em = 0;
	for (const ch of text) em += advance(ch.codePointAt(0)!, weight);
	return em * size;
}

/**
 * The lines a text wraps to in a box of `width` points, breaking at spaces (and inside a word only
 * when the word alone is wider than the box), as react-pdf does with hyphenation turned off.
 */
export function wrapText(text: string, width: number, size: number, weight: Weight = 400): string[] {
	const out: string[] = [];
	for (const para of printable(text).split('\n')) {
		let line = '';
		for (const word of para.split(/\s+/).filter(Boolean)) {
			const candidate = line ? `${line} ${word}` : word;
			if (textWidth(candidate, size, weight) <= width) {
				line = candidate;
				continue;
			}
			if (line) out.push(line);
			line = '';
			let rest = word;
			while (textWidth(rest, size, weight) > width) {
				let cut = rest.length - 1;
				while (cut > 1 && textWidth(rest.slice(0, cut), size, weight) > width) cut--;
				out.push(rest.slice(0, cut));
				rest = rest.slice(cut);
			}
			line = rest;
		}
		out.push(line);
	}
	return out;
}

/** Embeds the latin and latin-ext faces into a pdf-lib document (subset), for drawing footers. */
export async function embedFooterFonts(
	doc: PDFDocument,
): Promise<{ latin: PDFFont; ext: PDFFont; covers: (cp: number) => 'latin' | 'ext' }> {
	doc.registerFontkit(fontkit);
	const [latin, ext] = await Promise.all([
		doc.embedFont(fontBytes('latin', 400), { subset: true }),
		doc.embedFont(fontBytes('latin-ext', 400), { subset: true }),
	]);
	const covers = (cp: number) => (latinHas(cp) ? 'latin' : 'ext');
	return { latin, ext, covers };
}

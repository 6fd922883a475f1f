/**
 * Tables drawn on one react-pdf Canvas: a page of rows costs one layout node instead of hundreds,
 * which keeps an 84-position schedule well under a second. Text is wrapped beforehand with the
 * same font metrics (fonts.ts), so every row's height is known before drawing.
 */
import { Canvas } from '@react-pdf/renderer';
import { fontBytes, latinHas, textWidth, wrapText } from '../src/lib/documents/fonts';

export interface GridText {
	text: string;
	size: number;
	bold?: boolean;
	color?: string;
	/** Line height in points. */
	lineHeight: number;
}

export interface GridCell {
	lines: GridText[];
	align?: 'left' | 'right' | 'center';
	fill?: string;
}

export interface GridRow {
	height: number;
	cells: GridCell[];
	fill?: string;
	/** Line under the row: 'rule' (thin), 'strong' or 'none'. */
	border?: 'rule' | 'strong' | 'none';
}

export const CELL_PAD_X = 3;
export const CELL_PAD_Y = 2.5;
/** Noto Sans ascent + descent, in em: the height a line of glyphs takes. */
const GLYPH_EM = 1.362;

/** Wraps a text to a cell's inner width: one GridText per line. */
export function cellLines(
	text: string,
	width: number,
	size: number,
	lineHeight: number,
	opts: { bold?: boolean; color?: string } = {},
): GridText[] {
	if (!text) return [];
	return wrapText(text, (width - 2 * CELL_PAD_X) * 0.97, size, opts.bold ? 700 : 400).map((line) => ({
		text: line,
		size,
		lineHeight,
		...opts,
	}));
}

/** The height a cell's lines take, with padding. */
export function cellHeight(lines: GridText[]): number {
	return lines.reduce((h, l) => h + l.lineHeight, 0) + 2 * CELL_PAD_Y;
}

type FontKey = 'latin-400' | 'latin-700' | 'latin-ext-400' | 'latin-ext-700';
interface Op {
	font: FontKey;
	size: number;
	color: string;
	text: string;
	x: number;
	y: number;
}

function runs(text: string): { text: string; ext: boolean }[] {
	const out: { text: string; ext: boolean }[] = [];
	for (const ch of text) {
		const cp = ch.codePointAt(0)!;
		const ext = !latinHas(cp);
		const last = out[out.length - 1];
		if (last && last.ext === ext) last.text += ch;
		else out.push({ text: ch, ext });
	}
	return out;
}

/** A table drawn on a canvas of the given width; `columns` are widths in points. */
export function GridCanvas({
	columns,
	rows,
	color = '#1c232b',
	rule = '#b9c0c7',
}: {
	columns: number[];
	rows: GridRow[];
	color?: string;
	rule?: string;
}) {
	const width = columns.reduce((a, b) => a + b, 0);
	const height = rows.reduce((a, r) => a + r.height, 0);
	return (
		<Canvas
			style={{ width, height }}
			paint={(painter) => {
				// The painter forwards to pdfkit; its typings cover only part of what pdfkit takes.
				const p = painter as unknown as Painter;
				const ops: Op[] = [];
				let y = 0;
				for (const row of rows) {
					if (row.fill) p.rect(0, y, width, row.height).fill(row.fill);
					let x = 0;
					row.cells.forEach((c, i) => {
						const w = columns[i] ?? 0;
						if (c.fill) p.rect(x, y, w, row.height).fill(c.fill);
						let ty = y + CELL_PAD_Y;
						for (const line of c.lines) {
							const lineWidth = textWidth(line.text, line.size, line.bold ? 700 : 400);
							let tx = x + CELL_PAD_X;
							if (c.align === 'right') tx = x + w - CELL_PAD_X - lineWidth;
							else if (c.align === 'center') tx = x + (w - lineWidth) / 2;
							const top = ty + (line.lineHeight - line.size * GLYPH_EM) / 2;
							for (const r of runs(line.text)) {
								const font = `${r.ext ? 'latin-ext' : 'latin'}-${line.bold ? 700 : 400}` as FontKey;
								ops.push({ font, size: line.size, color: line.color ?? color, text: r.text, x: tx, y: top });
								tx += textWidth(r.text, line.size, line.bold ? 700 : 400);
							}
							ty += line.lineHeight;
						}
						x += w;
					});
					y += row.height;
				}
				// Rules: cell borders and row lines.
				p.lineWidth(0.5).strokeColor(rule);
				y = 0;
				for (const row of rows) {
					let x = 0;
					for (let i = 0; i < columns.length - 1; i++) {
						x += columns[i] ?? 0;
						p.moveTo(x, y).lineTo(x, y + row.height);
					}
					y += row.height;
					if (row.border !== 'none' && row.border !== 'strong') p.moveTo(0, y).lineTo(width, y);
				}
				p.stroke();
				y = 0;
				p.lineWidth(1).strokeColor(color);
				for (const row of rows) {
					y += row.height;
					if (row.border === 'strong') p.moveTo(0, y).lineTo(width, y);
				}
				p.stroke();
				// Text grouped by face, so the font is set a few times per table rather than per cell.
				const byFont = new Map<FontKey, Op[]>();
				for (const op of ops) {
					const list = byFont.get(op.font);
					if (list) list.push(op);
					else byFont.set(op.font, [op]);
				}
				for (const [key, list] of byFont) {
					const [subset, weight] = key.startsWith('latin-ext')
						? (['latin-ext', key.slice(10)] as const)
						: (['latin', key.slice(6)] as const);
					p.font(fontBytes(subset, Number(weight) as 400 | 700), list[0]!.size);
					for (const op of list)
						p.fontSize(op.size).fillColor(op.color).text(op.text, op.x, op.y, { lineBreak: false });
				}
				return null;
			}}
		/>
	);
}

interface Painter {
	rect(x: number, y: number, w: number, h: number): Painter;
	fill(color?: string): Painter;
	moveTo(x: number, y: number): Painter;
	lineTo(x: number, y: number): Painter;
	stroke(): Painter;
	lineWidth(w: number): Painter;
	strokeColor(c: string): Painter;
	fillColor(c: string): Painter;
	font(src: Uint8Array, size?: number): Painter;
	fontSize(size: number): Painter;
	text(text: string, x: number, y: number, options?: { lineBreak?: boolean }): Painter;
}

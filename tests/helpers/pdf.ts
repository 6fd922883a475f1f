/** Reading PDFs back in tests: text with positions (pdfjs-dist), page images (poppler's pdftoppm), QR codes (jsQR). */
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import jsQR from 'jsqr';
import sharp from 'sharp';

export interface TextItem {
	str: string;
	x: number;
	y: number;
	width: number;
	height: number;
}

export interface PdfPage {
	width: number;
	height: number;
	items: TextItem[];
	/** The page's text, items joined by spaces and runs of white space collapsed. */
	text: string;
}

/** Every page's text items and size, read with pdf.js. */
export async function readPdf(bytes: Uint8Array): Promise<PdfPage[]> {
	const pdfjs = await import('pdfjs-dist/legacy/build/pdf.mjs');
	const doc = await pdfjs.getDocument({
		data: new Uint8Array(bytes),
		useSystemFonts: false,
		isEvalSupported: false,
		verbosity: 0,
	}).promise;
	const pages: PdfPage[] = [];
	for (let i = 1; i <= doc.numPages; i++) {
		const page = await doc.getPage(i);
		const [x0, y0, x1, y1] = page.view as [number, number, number, number];
		const content = await page.getTextContent();
		const items: TextItem[] = [];
		for (const it of content.items) {
			if (!('str' in it) || !it.str.trim()) continue;
			items.push({
				str: it.str,
				x: it.transform[4],
				y: it.transform[5],
				width: it.width,
				height: it.height || Math.abs(it.transform[3]),
			});
		}
		pages.push({
			width: x1 - x0,
			height: y1 - y0,
			items,
			text: items
				.map((t) => t.str)
				.join(' ')
				.replace(/\s+/g, ' '),
		});
	}
	await doc.destroy();
	return pages;
}

/** Collapses white space, as text wrapped over several lines reads once extracted. */
export function squash(text: string): string {
	return text.replace(/\s+/g, ' ').trim();
}

/** Renders pages to PNG files with pdftoppm; returns their paths. */
export function pdfToPngs(bytes: Uint8Array, dpi = 100, first?: number, last?: number): string[] {
	const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'ampledger-pdf-'));
	const file = path.join(dir, 'doc.pdf');
	fs.writeFileSync(file, bytes);
	const args = ['-png', '-r', String(dpi)];
	if (first) args.push('-f', String(first));
	if (last) args.push('-l', String(last));
	execFileSync('pdftoppm', [...args, file, path.join(dir, 'page')]);
	return fs
		.readdirSync(dir)
		.filter((f) => f.endsWith('.png'))
		.sort()
		.map((f) => path.join(dir, f));
}

/** The text of the first QR code found in a PNG, or null. */
export async function decodeQr(pngFile: string): Promise<string | null> {
	const { data, info } = await sharp(pngFile).ensureAlpha().raw().toBuffer({ resolveWithObject: true });
	const code = jsQR(
		new Uint8ClampedArray(data.buffer, data.byteOffset, data.byteLength),
		info.width,
		info.height,
	);
	return code?.data ?? null;
}

/** Pairs of text items whose boxes overlap by more than `tolerance` points in both directions. */
export function overlappingItems(items: TextItem[], tolerance = 0.6): [TextItem, TextItem][] {
	const out: [TextItem, TextItem][] = [];
	const boxes = items.map((t) => ({
		t,
		x0: t.x,
		x1: t.x + t.width,
		y0: t.y - t.height * 0.2,
		y1: t.y + t.height * 0.75,
	}));
	for (let i = 0; i < boxes.length; i++) {
		for (let k = i + 1; k < boxes.length; k++) {
			const a = boxes[i]!;
			const b = boxes[k]!;
			const dx = Math.min(a.x1, b.x1) - Math.max(a.x0, b.x0);
			const dy = Math.min(a.y1, b.y1) - Math.max(a.y0, b.y0);
			if (dx > tolerance && dy > tolerance) out.push([a.t, b.t]);
		}
	}
	return out;
}

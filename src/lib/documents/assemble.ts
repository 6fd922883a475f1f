/** Rendering react-pdf sheets and the second pass with pdf-lib: merging and stamping sheet numbers. */
import { Document, renderToBuffer } from '@react-pdf/renderer';
import { createElement, type ReactElement } from 'react';
import { PDFDocument, rgb, type PDFFont, type PDFPage } from 'pdf-lib';
import { embedFooterFonts, printable, registerFonts, textWidth } from './fonts';
import { revisionText } from './revision';

/** Renders react-pdf pages into one PDF (fonts from disk, nothing fetched). */
export async function renderSheets(
	pages: ReactElement[],
	title: string,
	author: string,
): Promise<Uint8Array> {
	registerFonts();
	const doc = createElement(
		Document,
		{ title, author, creator: 'Ampledger', producer: 'Ampledger' },
		...pages,
	);
	// renderToBuffer's type asks for a Document element; ours is one, built without JSX.
	const buffer = await renderToBuffer(doc as Parameters<typeof renderToBuffer>[0]);
	return new Uint8Array(buffer.buffer, buffer.byteOffset, buffer.byteLength);
}

export const FOOTER_SIZE = 7.5;

/** The footer line of a sheet: "Sheet 2 of 9 · job · rev 1" (or "· rev 2 draft (not submitted)"). */
export function sheetLabel(
	index: number,
	total: number,
	job: string,
	revision: number,
	draft = false,
): string {
	return `Sheet ${index + 1} of ${total} · ${job} · ${revisionText(revision, draft)}`;
}

export type FooterFonts = { latin: PDFFont; ext: PDFFont; covers: (cp: number) => 'latin' | 'ext' };

/** Draws one line of text, switching to latin-ext for characters the latin face lacks. */
export function drawMixed(
	page: PDFPage,
	text: string,
	x: number,
	y: number,
	fonts: FooterFonts,
	size = FOOTER_SIZE,
	color = rgb(0.2, 0.23, 0.27),
) {
	let run = '';
	let runFont: 'latin' | 'ext' = 'latin';
	let at = x;
	const flush = () => {
		if (!run) return;
		const font = runFont === 'latin' ? fonts.latin : fonts.ext;
		page.drawText(run, { x: at, y, size, font, color });
		at += font.widthOfTextAtSize(run, size);
		run = '';
	};
	for (const ch of printable(text)) {
		const which = fonts.covers(ch.codePointAt(0)!);
		if (which !== runFont) {
			flush();
			runFont = which;
		}
		run += ch;
	}
	flush();
}

/**
 * Stamps "Sheet N of M · job · rev n" (the submission revision, or the draft of the next) at the foot of every page, plus an optional note on the right
 * (e.g. a merged sketch's caption), over whatever the page holds.
 */
export async function stampFooters(
	doc: PDFDocument,
	job: string,
	revision: { revision: number; draft: boolean },
	notes: (string | null)[] = [],
	embedded?: FooterFonts,
): Promise<void> {
	const fonts = embedded ?? (await embedFooterFonts(doc));
	const pages = doc.getPages();
	const clean = printable(job);
	const shortJob = clean.length > 70 ? `${clean.slice(0, 69)}…` : clean;
	pages.forEach((page, i) => {
		const { width } = page.getSize();
		const box = page.getMediaBox();
		const y = box.y + 16;
		const left = box.x + 30;
		page.drawLine({
			start: { x: left, y: y + 10 },
			end: { x: box.x + width - 30, y: y + 10 },
			thickness: 0.5,
			color: rgb(0.7, 0.73, 0.76),
		});
		drawMixed(page, sheetLabel(i, pages.length, shortJob, revision.revision, revision.draft), left, y, fonts);
		const note = notes[i];
		if (note) {
			const clean = printable(note);
			const clipped = clean.length > 80 ? `${clean.slice(0, 79)}…` : clean;
			const w = textWidth(clipped, FOOTER_SIZE);
			drawMixed(page, clipped, box.x + width - 30 - w, y, fonts);
		}
	});
}

/** A new pdf-lib document with the metadata every Ampledger PDF carries. */
export async function newAssembly(title: string, author: string): Promise<PDFDocument> {
	const doc = await PDFDocument.create();
	doc.setTitle(title);
	doc.setAuthor(author);
	doc.setCreator('Ampledger');
	doc.setProducer('Ampledger');
	return doc;
}

/** Copies every page of a PDF (bytes) into the assembly, returning the pages added. */
export async function appendPdf(
	target: PDFDocument,
	bytes: Uint8Array,
	range?: [number, number],
): Promise<PDFPage[]> {
	const source = await PDFDocument.load(bytes, { ignoreEncryption: true });
	const count = source.getPageCount();
	const [from, to] = range ?? [0, count];
	const indices = Array.from({ length: Math.max(0, Math.min(to, count) - from) }, (_, i) => from + i);
	const copied = await target.copyPages(source, indices);
	for (const p of copied) target.addPage(p);
	return copied;
}

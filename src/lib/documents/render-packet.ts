import fs from 'node:fs/promises';
import { PDFDocument, rgb } from 'pdf-lib';
import { packetPlan, type SketchSection } from '../../../templates/Packet';
import { SHEET } from '../../../templates/common';
import { drawMixed, newAssembly, renderSheets, stampFooters } from './assemble';
import { embedFooterFonts } from './fonts';
import { drawFitted, embedSketchImage } from './images';
import type { DocumentData, PaperSize, SketchSource } from './types';

interface LoadedSketch {
	source: SketchSource;
	title: string;
	bytes: Uint8Array;
	pdf: PDFDocument | null;
	pages: number;
	/** Why the file could not be placed, or null. */
	problem: string | null;
}

const clip = (t: string, max: number) => (t.length > max ? `${t.slice(0, max - 1)}…` : t);

function sketchTitle(s: SketchSource, i: number, total: number): string {
	const what = s.caption.trim() || s.originalName;
	return `Sketch ${i + 1} of ${total}: ${what}${s.roomName ? ` (${s.roomName})` : ''}`;
}

async function loadSketches(sketches: SketchSource[]): Promise<LoadedSketch[]> {
	return Promise.all(
		sketches.map(async (source, i) => {
			const title = sketchTitle(source, i, sketches.length);
			let bytes: Uint8Array;
			try {
				bytes = new Uint8Array(await fs.readFile(source.path));
			} catch {
				return {
					source,
					title,
					bytes: new Uint8Array(),
					pdf: null,
					pages: 1,
					problem: 'The file is missing from storage.',
				};
			}
			if (source.contentType !== 'application/pdf')
				return { source, title, bytes, pdf: null, pages: 1, problem: null };
			try {
				const pdf = await PDFDocument.load(bytes, { ignoreEncryption: true, updateMetadata: false });
				return { source, title, bytes, pdf, pages: pdf.getPageCount(), problem: null };
			} catch {
				return {
					source,
					title,
					bytes,
					pdf: null,
					pages: 1,
					problem: 'The PDF could not be read, so its pages are not merged.',
				};
			}
		}),
	);
}

/**
 * The permit packet as one PDF: generated sheets from the templates, the sketches placed between
 * them (images fitted with a caption, PDF pages merged one by one), every page stamped
 * "Sheet N of M · job · rev n".
 */
export async function renderPacket(data: DocumentData, size: PaperSize = 'letter'): Promise<Uint8Array> {
	const loaded = await loadSketches(data.sketches);
	const sections: SketchSection[] = loaded.map((l) => ({ title: l.title, pages: l.pages }));
	const plan = packetPlan(data, size, sections);
	const title = `Permit packet · ${data.job.name}`;
	const out = await newAssembly(title, data.firm.name);
	// Images are prepared (sharp works off the main thread) while react-pdf lays out the sheets.
	const imagesReady = Promise.all(
		loaded.map((l) =>
			l.pdf || l.problem
				? null
				: embedSketchImage(out, l.bytes, l.source.contentType as 'image/png' | 'image/jpeg'),
		),
	);
	const sheets = await renderSheets([...plan.before, ...plan.after], title, data.firm.name);
	const images = await imagesReady;

	const generated = await PDFDocument.load(sheets);
	const copied = await out.copyPages(generated, generated.getPageIndices());
	const notes: (string | null)[] = [];
	for (let i = 0; i < plan.before.length; i++) {
		out.addPage(copied[i]!);
		notes.push(null);
	}
	const fonts = await embedFooterFonts(out);
	const { width, height } = SHEET[size];
	for (const [i, l] of loaded.entries()) {
		if (l.pdf && !l.problem) {
			const pages = await out.copyPages(l.pdf, l.pdf.getPageIndices());
			pages.forEach((p, k) => {
				out.addPage(p);
				notes.push(
					`${l.title.replace(/^Sketch \d+ of \d+: /, 'Sketch: ')}, page ${k + 1} of ${pages.length}`,
				);
			});
			continue;
		}
		const page = out.addPage([width, height]);
		notes.push(null);
		drawMixed(page, clip(l.title, 110), 30, height - 44, fonts, 12, rgb(0.11, 0.14, 0.17));
		drawMixed(
			page,
			clip(`${l.source.originalName} · ${l.source.contentType}`, 160),
			30,
			height - 58,
			fonts,
			7.5,
		);
		if (l.problem) {
			drawMixed(page, l.problem, 30, height / 2, fonts, 11, rgb(0.64, 0.09, 0.1));
			continue;
		}
		const img = images[i];
		if (img) drawFitted(page, img, { x: 30, y: 54, width: width - 60, height: height - 54 - 70 });
	}
	for (let i = plan.before.length; i < copied.length; i++) {
		out.addPage(copied[i]!);
		notes.push(null);
	}
	await stampFooters(out, data.job.name, data, notes, fonts);
	return out.save();
}

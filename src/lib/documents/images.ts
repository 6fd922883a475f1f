/**
 * Sketch images as pages of a pdf-lib document. JPEG is embedded as it is; PNG data goes in
 * without decoding when it is plain 8-bit RGB or grey (PDF reads PNG's own compressed rows),
 * otherwise sharp flattens it onto white first. This keeps a 2000 × 1500 plan to a few milliseconds.
 */
import { drawImage, popGraphicsState, pushGraphicsState, degrees } from 'pdf-lib';
import type { PDFDocument, PDFName, PDFPage, PDFRef } from 'pdf-lib';
import sharp from 'sharp';

interface PngInfo {
	width: number;
	height: number;
	colors: 1 | 3;
	idat: Uint8Array;
}

/** The compressed rows of a PNG that PDF can read as they are, or null when it needs converting. */
function passThroughPng(bytes: Uint8Array): PngInfo | null {
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	if (bytes.length < 33 || view.getUint32(0) !== 0x89504e47) return null;
	let offset = 8;
	let width = 0;
	let height = 0;
	let colors: 1 | 3 | null = null;
	const parts: Uint8Array[] = [];
	let total = 0;
	while (offset + 8 <= bytes.length) {
		const length = view.getUint32(offset);
		const type = String.fromCharCode(...bytes.subarray(offset + 4, offset + 8));
		const data = bytes.subarray(offset + 8, offset + 8 + length);
		if (type === 'IHDR') {
			width = view.getUint32(offset + 8);
			height = view.getUint32(offset + 12);
			const bitDepth = data[8];
			const colorType = data[9];
			const interlace = data[12];
			if (bitDepth !== 8 || interlace !== 0) return null;
			if (colorType === 2) colors = 3;
			else if (colorType === 0) colors = 1;
			else return null;
		} else if (type === 'tRNS') {
			return null;
		} else if (type === 'IDAT') {
			parts.push(data);
			total += data.length;
		} else if (type === 'IEND') break;
		offset += 12 + length;
	}
	if (!colors || parts.length === 0) return null;
	const idat = new Uint8Array(total);
	let at = 0;
	for (const p of parts) {
		idat.set(p, at);
		at += p.length;
	}
	return { width, height, colors, idat };
}

async function embedPngFast(
	doc: PDFDocument,
	bytes: Uint8Array,
): Promise<{ ref: PDFRef; width: number; height: number }> {
	let info = passThroughPng(bytes);
	if (!info) {
		const flat = await sharp(bytes)
			.flatten({ background: '#ffffff' })
			.toColourspace('srgb')
			.png({ compressionLevel: 6 })
			.toBuffer();
		info = passThroughPng(flat);
		if (!info) throw new Error('could not convert the PNG sketch');
	}
	const stream = doc.context.stream(info.idat, {
		Type: 'XObject',
		Subtype: 'Image',
		Width: info.width,
		Height: info.height,
		ColorSpace: info.colors === 3 ? 'DeviceRGB' : 'DeviceGray',
		BitsPerComponent: 8,
		Filter: 'FlateDecode',
		DecodeParms: { Predictor: 15, Colors: info.colors, BitsPerComponent: 8, Columns: info.width },
	});
	return { ref: doc.context.register(stream), width: info.width, height: info.height };
}

/** An embedded image, ready to draw on any page of the document. */
export interface PlacedImage {
	ref: PDFRef;
	width: number;
	height: number;
}

/** Embeds a PNG or JPEG sketch into the document. */
export async function embedSketchImage(
	doc: PDFDocument,
	bytes: Uint8Array,
	type: 'image/png' | 'image/jpeg',
): Promise<PlacedImage> {
	if (type === 'image/jpeg') {
		const img = await doc.embedJpg(bytes);
		return { ref: img.ref, width: img.width, height: img.height };
	}
	return embedPngFast(doc, bytes);
}

/** Draws an embedded image fitted (aspect kept, centred) into a box on a page. */
export function drawFitted(
	page: PDFPage,
	img: PlacedImage,
	box: { x: number; y: number; width: number; height: number },
) {
	const scale = Math.min(box.width / img.width, box.height / img.height);
	const width = img.width * scale;
	const height = img.height * scale;
	const name = page.node.newXObject('Sketch', img.ref);
	page.pushOperators(
		pushGraphicsState(),
		...drawImage(name as PDFName, {
			x: box.x + (box.width - width) / 2,
			y: box.y + (box.height - height) / 2,
			width,
			height,
			rotate: degrees(0),
			xSkew: degrees(0),
			ySkew: degrees(0),
		}),
		popGraphicsState(),
	);
	return { width, height };
}

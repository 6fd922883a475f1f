import QRCode from 'qrcode';
import { directoryCardPages } from '../../../templates/DirectoryCard';
import { appendPdf, newAssembly, renderSheets, stampFooters } from './assemble';
import type { DocumentData, PaperSize } from './types';

/** A QR code of a link as a PNG data URL (error correction M: readable through a scuffed card). */
export function qrDataUrl(link: string): Promise<string> {
	return QRCode.toDataURL(link, {
		errorCorrectionLevel: 'M',
		margin: 2,
		scale: 8,
		color: { dark: '#000000', light: '#ffffff' },
	});
}

/** The directory card of one panel as a PDF, with a QR code of the panel map link when there is one. */
export async function renderDirectoryCard(
	data: DocumentData,
	panelId: string,
	size: PaperSize = 'letter',
): Promise<Uint8Array> {
	const panel = data.doc.panels.find((p) => p.id === panelId);
	const title = `Circuit directory: ${panel?.name ?? panelId} · ${data.job.name}`;
	const qr = data.mapUrl ? await qrDataUrl(data.mapUrl) : null;
	const sheets = await renderSheets(directoryCardPages(data, panelId, size, qr), title, data.firm.name);
	const out = await newAssembly(title, data.firm.name);
	await appendPdf(out, sheets);
	await stampFooters(out, data.job.name, data);
	return out.save();
}

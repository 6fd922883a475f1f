import { panelSchedulePages } from '../../../templates/PanelSchedule';
import { appendPdf, newAssembly, renderSheets, stampFooters } from './assemble';
import type { DocumentData, PaperSize } from './types';

/** The panel schedule of one panel as a PDF, its sheets numbered. */
export async function renderPanelSchedule(
	data: DocumentData,
	panelId: string,
	size: PaperSize = 'letter',
): Promise<Uint8Array> {
	const panel = data.doc.panels.find((p) => p.id === panelId);
	const title = `Panel schedule: ${panel?.name ?? panelId} · ${data.job.name}`;
	const sheets = await renderSheets(panelSchedulePages(data, panelId, size), title, data.firm.name);
	const out = await newAssembly(title, data.firm.name);
	await appendPdf(out, sheets);
	await stampFooters(out, data.job.name, data);
	return out.save();
}

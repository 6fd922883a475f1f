import { renderDirectoryCard } from './render-directory-card';
import { renderPacket } from './render-packet';
import { renderPanelSchedule } from './render-panel-schedule';
import type { DocumentData, PaperSize } from './types';

/** One rendering to do, as plain data (it crosses to the worker thread). */
export type RenderRequest =
	| { kind: 'packet'; data: DocumentData; size: PaperSize }
	| { kind: 'panel-schedule'; data: DocumentData; panelId: string; size: PaperSize }
	| { kind: 'directory-card'; data: DocumentData; panelId: string; size: PaperSize };

/** Renders a request in this thread. */
export function renderHere(req: RenderRequest): Promise<Uint8Array> {
	switch (req.kind) {
		case 'packet':
			return renderPacket(req.data, req.size);
		case 'panel-schedule':
			return renderPanelSchedule(req.data, req.panelId, req.size);
		case 'directory-card':
			return renderDirectoryCard(req.data, req.panelId, req.size);
	}
}

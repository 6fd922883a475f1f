/** The panel map and directory card pages' data for a job, reached by token or by a signed-in homeowner. */
import type { Knex } from 'knex';
import { computeJob, parseJobDocument } from '../electrical';
import { jobDocumentFromRows } from '../job-document';
import { loadJobTree } from '../repositories/jobs';
import { listSketches } from '../repositories/sketches';
import { panelMapData, type PanelMapData } from './panel-map';

export interface MapUrls {
	/** The URL of a sketch's file or thumbnail for this way of reaching the map. */
	sketch: (id: string, which: 'file' | 'thumbnail') => string;
	card: string;
}

/** The map of a job, or null when the job is gone or not yet a complete document. */
export async function mapPageData(knex: Knex, jobId: string, urls: MapUrls): Promise<PanelMapData | null> {
	const tree = await loadJobTree(knex, jobId);
	if (!tree) return null;
	const parsed = parseJobDocument(jobDocumentFromRows(tree));
	if (!parsed.ok) return null;
	const sketches = await listSketches(knex, jobId);
	return panelMapData(
		parsed.doc,
		computeJob(parsed.doc),
		sketches.map((s) => ({
			id: s.id,
			caption: s.caption || s.original_name,
			thumbnailUrl: s.has_thumbnail ? urls.sketch(s.id, 'thumbnail') : null,
			fileUrl: urls.sketch(s.id, 'file'),
			contentType: s.content_type,
		})),
		urls.card,
	);
}

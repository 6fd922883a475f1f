/** Gathers a job's document data from the database: the engine's document and result, facts, sketches. */
import type { Knex } from 'knex';
import { layoutRecessedLights, parseJobDocument } from '../electrical';
import { AppError, errors } from '../errors';
import { jobDocumentFromRows, type JobTree } from '../job-document';
import { documentRevision, firmForDocuments, jurisdictionForDocuments } from '../repositories/documents';
import { loadJobTree } from '../repositories/jobs';
import { listLightingLayouts } from '../repositories/lighting-layouts';
import { listSketches } from '../repositories/sketches';
import { sketchPaths } from '../sketch-storage';
import { documentData, permitTypeOf } from './data';
import type { DocumentData, LightingLayoutSource } from './types';

/** The job's tree, or 404. */
export async function jobTreeOr404(knex: Knex, jobId: string): Promise<JobTree> {
	const tree = await loadJobTree(knex, jobId);
	if (!tree) throw errors.notFound('job');
	return tree;
}

/**
 * Document data for a job. A job the engine cannot read yet (no main panel, a subpanel without its
 * feeder) is a 409 naming what to complete.
 */
export async function jobDocumentData(
	knex: Knex,
	tree: JobTree,
	options: {
		mapUrl: string | null;
		withSketches?: boolean;
		date?: string;
		/** The submission being made (printed "rev N"); by default the live job's draft of its next one. */
		revision?: { revision: number; draft: boolean };
		explanations?: DocumentData['explanations'];
	},
): Promise<DocumentData> {
	const parsed = parseJobDocument(jobDocumentFromRows(tree));
	if (!parsed.ok) {
		throw new AppError('conflict', 'The job is not complete enough for documents yet.', {
			details: { errors: parsed.errors },
		});
	}
	const { job } = tree;
	const rooms = new Map(tree.rooms.map((r) => [r.id, r.name]));
	const [firm, jurisdiction, revision, sketchRows, layoutRows] = await Promise.all([
		firmForDocuments(knex, job.firmId),
		jurisdictionForDocuments(knex, job.jurisdictionId),
		options.revision ?? documentRevision(knex, job.id),
		options.withSketches ? listSketches(knex, job.id) : Promise.resolve([]),
		options.withSketches ? listLightingLayouts(knex, job.id) : Promise.resolve([]),
	]);
	const layouts: LightingLayoutSource[] = [];
	for (const l of layoutRows) {
		const laid = layoutRecessedLights(l.input);
		if (laid.ok)
			layouts.push({
				title: l.title,
				roomName: l.roomName ?? 'room not named',
				input: l.input,
				layout: laid.layout,
			});
	}
	return documentData({
		doc: parsed.doc,
		job: {
			name: job.name,
			address: job.address,
			homeownerName: job.homeownerName,
			homeownerEmail: job.homeownerEmail,
			permitNumber: job.permitNumber,
			scopeOfWork: job.scopeOfWork,
			permitType: permitTypeOf(parsed.doc),
		},
		firm,
		jurisdiction,
		revision: revision.revision,
		draft: revision.draft,
		...(options.explanations?.length ? { explanations: options.explanations } : {}),
		date: options.date ?? new Date().toISOString().slice(0, 10),
		sketches: sketchRows.map((s) => ({
			id: s.id,
			caption: s.caption,
			originalName: s.original_name,
			contentType: s.content_type,
			path: sketchPaths(s).file,
			roomName: s.room_id ? (rooms.get(s.room_id) ?? null) : null,
		})),
		layouts,
		mapUrl: options.mapUrl,
	});
}

import { computeJob } from '../electrical';
import type { JobDocument } from '../electrical';
import type { DocumentData } from './types';

/** The permit type a job's circuits imply: work on an existing dwelling or a new installation. */
export function permitTypeOf(doc: JobDocument): string {
	const existing = doc.circuits.some((c) => c.status !== 'new');
	return existing
		? 'Residential electrical: alteration of an existing dwelling'
		: 'Residential electrical: new installation';
}

/** Document data with the engine's result computed from the document. */
export function documentData(input: Omit<DocumentData, 'result'>): DocumentData {
	return { ...input, result: computeJob(input.doc) };
}

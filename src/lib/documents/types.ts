import type { JobDocument, JobResult, RecessedLayout, RecessedLayoutInput } from '../electrical';

/** Paper the schedules and packet print on. */
export type PaperSize = 'letter' | 'a4';

export interface FirmInfo {
	name: string;
	licenceNumber: string;
	phone: string | null;
	address: string | null;
}

export interface JurisdictionInfo {
	name: string;
	address: string | null;
}

/** A sketch to place in the packet: a file on disk with what the database knows of it. */
export interface SketchSource {
	id: string;
	caption: string;
	originalName: string;
	contentType: 'image/png' | 'image/jpeg' | 'application/pdf';
	path: string;
	roomName: string | null;
}

/** A recessed-light layout for one room, computed by the engine, drawn to scale in the packet. */
export interface LightingLayoutSource {
	title: string;
	roomName: string;
	input: RecessedLayoutInput;
	layout: RecessedLayout;
}

/** The job facts the documents print beside the engine's document and result. */
export interface JobFacts {
	name: string;
	address: string;
	homeownerName: string;
	homeownerEmail: string;
	permitNumber: string;
	scopeOfWork: string;
	/** e.g. 'Residential electrical: alteration of an existing dwelling'. */
	permitType: string;
}

/** An error-level finding the contractor left in a submission, with their note on it. */
export interface ExplainedFinding {
	/** `code:targetKind:targetId`, stable across renders of one document. */
	findingKey: string;
	code: string;
	message: string;
	rule: string;
	note: string;
}

/**
 * Everything a document is rendered from: plain data, no database, so templates can be tested and
 * benchmarked without a server.
 */
export interface DocumentData {
	doc: JobDocument;
	result: JobResult;
	job: JobFacts;
	firm: FirmInfo;
	jurisdiction: JurisdictionInfo | null;
	/**
	 * The submission revision the document is: N for a stored submission, or the number the next
	 * submission will get when `draft` (the live job, not submitted as it is).
	 */
	revision: number;
	/** True for a document of the live job: printed "rev N draft (not submitted)". */
	draft: boolean;
	/** The contractor's notes on error-level findings left in a submission, printed in the packet. */
	explanations?: ExplainedFinding[];
	/** ISO date (YYYY-MM-DD) printed on the documents. */
	date: string;
	sketches: SketchSource[];
	layouts: LightingLayoutSource[];
	/** The homeowner's panel map link for the directory card's QR code, or null for none. */
	mapUrl: string | null;
}

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
	/** Changes recorded for the job when the document was made. */
	revision: number;
	/** ISO date (YYYY-MM-DD) printed on the documents. */
	date: string;
	sketches: SketchSource[];
	layouts: LightingLayoutSource[];
	/** The homeowner's panel map link for the directory card's QR code, or null for none. */
	mapUrl: string | null;
}

/** The job as the browser holds it (records from the JSON API) and the engine run on it in the browser. */
import {
	engineOutcome,
	jobDocumentFromRows,
	type EngineOutcome,
	type JobTree as Tree,
} from '../job-document';

export type { CircuitRecord, JobRecord, LoadRecord, PanelRecord, RoomRecord } from '../repositories/rows';
export type EngineAnswer = EngineOutcome;

/** GET /api/jobs/:jobId/tree: the records and the server's engine answer. */
export interface JobTree extends Tree {
	engine?: EngineAnswer;
}

/** Runs the engine in the browser on the records as they are (or as being edited): the same code the server runs. */
export function computeTree(tree: Tree): EngineAnswer {
	return engineOutcome(jobDocumentFromRows(tree));
}

import type { Knex } from 'knex';
import fs from 'node:fs';
import path from 'node:path';
import { stopRenderWorker } from '../src/lib/documents/render-pool.ts';
import { loadCurrentUser } from '../src/lib/repositories/accounts.ts';
import { addCommentEntry, createComment } from '../src/lib/repositories/review-comments.ts';
import {
	answerInspectionItem,
	recordInspectionResult,
	requestInspection,
	scheduleInspection,
} from '../src/lib/repositories/inspections.ts';
import { importJob } from '../src/lib/repositories/job-import.ts';
import type { JobRef } from '../src/lib/access.ts';
import type { CurrentUser } from '../src/lib/roles.ts';
import { assignToMe, decide } from '../src/lib/workflow/review.ts';
import { moveJob } from '../src/lib/workflow/simple-moves.ts';
import { submitJob } from '../src/lib/workflow/submission.ts';
import { todayIso } from '../src/lib/schemas/inspection.ts';
import { DEMO_ACCOUNTS, DEMO_FIRM, DEMO_JURISDICTION, DEMO_PROPERTIES } from './data/demo-accounts.ts';

/** The two workflow jobs of the demo: one in plan review with open comments, one carried to its final inspection. */
export const DEMO_WORKFLOW_JOBS = {
	inReview: {
		example: 'quillmere-cottage.json',
		name: 'Calderwood house: heat pump, EV charger and kitchen',
		address: DEMO_PROPERTIES.calderwood,
		homeownerName: DEMO_ACCOUNTS.homeowner2.name,
		homeownerEmail: DEMO_ACCOUNTS.homeowner2.email,
		scopeOfWork:
			'Heat pump and air handler, a 48 A EV charger in the garage, kitchen counter circuits renewed. Existing 200 A service kept.',
	},
	closed: {
		example: 'orrinsby-new-house.json',
		name: 'Brindle Copse Way: new house with garage subpanel',
		address: DEMO_PROPERTIES.brindle,
		homeownerName: DEMO_ACCOUNTS.homeowner3.name,
		homeownerEmail: DEMO_ACCOUNTS.homeowner3.email,
		scopeOfWork: 'New single-family house: 200 A service, main panel and a 60 A garage subpanel.',
	},
} as const;

const examplesDir = path.resolve(import.meta.dirname, '..', 'examples');

async function userOf(knex: Knex, email: string): Promise<CurrentUser> {
	const row = await knex('users').where({ email }).first('id');
	const user = row ? await loadCurrentUser(knex, row.id) : null;
	if (!user) throw new Error(`demo account ${email} is missing: run the accounts seed first`);
	return user;
}

async function refOf(knex: Knex, jobId: string): Promise<JobRef> {
	return knex<JobRef>('jobs')
		.where({ id: jobId })
		.first(
			'id',
			'firm_id',
			'property_id',
			'jurisdiction_id',
			'current_revision',
			'status',
		) as Promise<JobRef>;
}

/** Imports an example job as the demo firm's, at a demo address, filed with the demo jurisdiction. */
async function demoJob(
	knex: Knex,
	owner: CurrentUser,
	spec: (typeof DEMO_WORKFLOW_JOBS)[keyof typeof DEMO_WORKFLOW_JOBS],
): Promise<string> {
	const doc = JSON.parse(fs.readFileSync(path.join(examplesDir, spec.example), 'utf8'));
	const firm = await knex('firms').where({ name: DEMO_FIRM.name }).first('id');
	const jurisdiction = await knex('jurisdictions').where({ name: DEMO_JURISDICTION.name }).first('id');
	const { job } = await importJob(knex, owner, firm.id, { ...doc, name: spec.name, address: spec.address });
	await knex('jobs').where({ id: job.id }).update({
		jurisdiction_id: jurisdiction.id,
		homeowner_name: spec.homeownerName,
		homeowner_email: spec.homeownerEmail,
		scope_of_work: spec.scopeOfWork,
	});
	return job.id;
}

async function circuitLabelled(knex: Knex, jobId: string, label: string): Promise<string> {
	const row = await knex('circuits as c')
		.join('panels as p', 'p.id', 'c.panel_id')
		.where({ 'p.job_id': jobId, 'c.label': label })
		.first('c.id');
	if (!row) throw new Error(`demo circuit “${label}” is missing`);
	return row.id;
}

/** Requests, schedules and records one inspection through the inspection functions; returns its id. */
async function inspect(
	knex: Knex,
	owner: CurrentUser,
	inspector: CurrentUser,
	jobId: string,
	kind: 'rough-in' | 'final',
	result: { result: 'pass' | 'fail'; notes: string; items: string[] },
): Promise<string> {
	const today = todayIso();
	const id = await knex.transaction((trx) =>
		requestInspection(trx, owner, jobId, { kind, preferredDates: [today], note: '' }),
	);
	await knex.transaction((trx) => scheduleInspection(trx, inspector, id, { scheduledFor: today }));
	await knex.transaction((trx) => recordInspectionResult(trx, inspector, id, result));
	return id;
}

/**
 * The permit workflow in the demo, made through the workflow's own functions so that the stored
 * revisions and their packets are real: a job in plan review with open comments (one pinned to a
 * point on a sheet, one to a circuit, one answered by the contractor), and a closed job whose
 * rough-in failed once, was corrected, and passed with the final inspection.
 */
export async function seed(knex: Knex): Promise<void> {
	if (process.env.NODE_ENV === 'production' && process.env.AMPLEDGER_ALLOW_DEMO !== '1') {
		throw new Error(
			'The demo seed is not for production databases (set AMPLEDGER_ALLOW_DEMO=1 to override).',
		);
	}
	const owner = await userOf(knex, DEMO_ACCOUNTS.owner.email);
	const inspector = await userOf(knex, DEMO_ACCOUNTS.inspector.email);
	try {
		// In plan review, with comments.
		const reviewId = await demoJob(knex, owner, DEMO_WORKFLOW_JOBS.inReview);
		await submitJob(knex, owner, await refOf(knex, reviewId), {
			explanations: [],
			note: 'The existing 200 A service stays; the load calculation uses the measured peak demand.',
		});
		await assignToMe(knex, inspector, reviewId);
		await createComment(knex, inspector.id, reviewId, {
			targetKind: 'sheet',
			sheet: 1,
			point: { x: 0.62, y: 0.34 },
			body: 'Give the grounding electrode conductor size and where it connects.',
		});
		await createComment(knex, inspector.id, reviewId, {
			targetKind: 'circuit',
			circuitId: await circuitLabelled(knex, reviewId, 'Kitchen counter receptacles, left of sink'),
			body: 'Show the GFCI protection for this counter circuit on the schedule: breaker or first receptacle?',
		});
		const answered = await createComment(knex, inspector.id, reviewId, {
			targetKind: 'job',
			body: 'Which heat pump model is installed? The nameplate minimum circuit ampacity decides the branch circuit.',
		});
		await addCommentEntry(knex, owner.id, ['contractor'], answered.id, {
			action: 'reply',
			body: 'A 3-ton unit with a minimum circuit ampacity of 26 A; the nameplate photo comes with the next revision.',
		});

		// Approved, inspected and closed.
		const closedId = await demoJob(knex, owner, DEMO_WORKFLOW_JOBS.closed);
		await submitJob(knex, owner, await refOf(knex, closedId), { explanations: [], note: '' });
		await assignToMe(knex, inspector, closedId);
		await decide(knex, inspector, closedId, { decision: 'approve', note: 'Approved as submitted.' });
		const failed = await inspect(knex, owner, inspector, closedId, 'rough-in', {
			result: 'fail',
			notes: 'Most of the rough-in is good. One box in the hallway is over its fill.',
			items: ['Hallway switch box: box fill over the allowance of 314.16; use a deeper box.'],
		});
		const item = await knex('inspection_items').where({ inspection_id: failed }).first('id');
		await knex.transaction((trx) =>
			answerInspectionItem(trx, owner, item.id, {
				answer: 'Replaced with a 22.5 in³ box; the conductors are unchanged.',
			}),
		);
		await inspect(knex, owner, inspector, closedId, 'rough-in', {
			result: 'pass',
			notes: 'The hallway box was replaced. Rough-in accepted.',
			items: [],
		});
		await inspect(knex, owner, inspector, closedId, 'final', {
			result: 'pass',
			notes: 'Devices, covers and the panel directories are complete.',
			items: [],
		});
		await moveJob(knex, inspector, await refOf(knex, closedId), { action: 'close', note: '' });
	} finally {
		await stopRenderWorker();
	}
}

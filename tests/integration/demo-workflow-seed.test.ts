import { afterAll, describe, expect, test } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_JURISDICTION } from '../../seeds/data/demo-accounts';
import { DEMO_WORKFLOW_JOBS } from '../../seeds/04_demo_workflow';
import { testDb } from '../helpers/db';
import { signedInAs } from '../helpers/http';
import { call } from '../helpers/jobs';

const db = testDb();

afterAll(async () => {
	await db.destroy();
});

const jobNamed = (name: string) => db('jobs').where({ name }).whereNull('deleted_at').first();

describe('the demo seed shows the permit workflow at once', () => {
	test('the job in plan review has a real stored packet and open comments on a sheet point, a circuit and the job', async () => {
		const job = await jobNamed(DEMO_WORKFLOW_JOBS.inReview.name);
		expect(job).toMatchObject({ status: 'in-review', current_revision: 1 });
		const inspector = await db('users').where({ email: DEMO_ACCOUNTS.inspector.email }).first('id');
		expect(job.assigned_inspector_id).toBe(inspector.id);
		const revision = await db('job_revisions').where({ job_id: job.id, number: 1 }).first();
		expect(Buffer.from(revision.packet_pdf).subarray(0, 5).toString()).toBe('%PDF-');
		expect(revision.packet_pages).toBeGreaterThan(1);
		const comments = await db('review_comments').where({ job_id: job.id }).orderBy('seq');
		expect(comments.map((c) => [c.target_kind, c.status])).toEqual([
			['sheet', 'open'],
			['circuit', 'open'],
			['job', 'open'],
		]);
		expect(comments[0]).toMatchObject({ sheet: 1, point_x: 0.62, point_y: 0.34 });
		const replies = await db('review_comment_entries as e')
			.join('users as u', 'u.id', 'e.author_id')
			.where({ 'e.comment_id': comments[2].id, 'e.action': 'reply' })
			.select('u.email');
		expect(replies.map((r) => r.email)).toEqual([DEMO_ACCOUNTS.owner.email]);
	});

	test('the closed job has an approved revision 1 with a permit number by the jurisdiction’s pattern', async () => {
		const job = await jobNamed(DEMO_WORKFLOW_JOBS.closed.name);
		expect(job).toMatchObject({ status: 'closed', current_revision: 1 });
		// The demo pattern QC-E{YYYY}-{SEQ:4}.
		expect(job.permit_number).toMatch(/^QC-E\d{4}-\d{4}$/);
		expect(DEMO_JURISDICTION.permitNumberPattern).toBe('QC-E{YYYY}-{SEQ:4}');
		const moves = await db('audit_log')
			.where({ job_id: job.id, entity: 'status' })
			.orderBy('id')
			.select('after');
		expect(moves.map((m) => m.after.status)).toEqual([
			'submitted',
			'in-review',
			'approved',
			'rough-in-failed',
			'rough-in-passed',
			'final-passed',
			'closed',
		]);
	});

	test('the closed job’s rough-in failed once with an answered correction item, then rough-in and final passed', async () => {
		const job = await jobNamed(DEMO_WORKFLOW_JOBS.closed.name);
		const inspections = await db('inspections').where({ job_id: job.id }).orderBy('seq');
		expect(inspections.map((i) => [i.kind, i.status])).toEqual([
			['rough-in', 'failed'],
			['rough-in', 'passed'],
			['final', 'passed'],
		]);
		const items = await db('inspection_items').where({ inspection_id: inspections[0].id });
		expect(items).toHaveLength(1);
		expect(items[0].status).toBe('answered');
		expect(items[0].answer).toMatch(/box/);
	});

	test('the homeowners see the permits of their homes', async () => {
		const closed = await jobNamed(DEMO_WORKFLOW_JOBS.closed.name);
		const inReview = await jobNamed(DEMO_WORKFLOW_JOBS.inReview.name);
		const first = await signedInAs('homeowner3');
		const page = await (await first.fetch(`/homeowner/homes/${closed.property_id}`)).text();
		expect(page).toContain('Closed');
		expect(page).toContain(closed.permit_number);
		const start = await (await first.fetch('/homeowner')).text();
		expect(start).toMatch(new RegExp(`Closed</strong>[\\s\\S]*permit ${closed.permit_number}`));
		const second = await signedInAs('homeowner2');
		expect(await (await second.fetch(`/homeowner/homes/${inReview.property_id}`)).text()).toContain(
			'In plan review',
		);
		expect((await second.fetch(`/homeowner/homes/${closed.property_id}`)).status).toBe(404);
	});

	test('the demo inspector administers the demo jurisdiction’s settings', async () => {
		const j = await db('jurisdictions').where({ name: DEMO_JURISDICTION.name }).first();
		expect(j).toMatchObject({
			fee_base_cents: DEMO_JURISDICTION.fees.baseCents,
			permit_number_pattern: 'QC-E{YYYY}-{SEQ:4}',
		});
		const inspector = await signedInAs('inspector');
		const res = await call(inspector, 'GET', `/api/jurisdictions/${j.id}/settings`);
		expect(res.status).toBe(200);
		expect(res.body.canEdit).toBe(true);
	});
});

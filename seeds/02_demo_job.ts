import type { Knex } from 'knex';
import { importJob } from '../src/lib/repositories/job-import.ts';
import { createLightingLayout } from '../src/lib/repositories/lighting-layouts.ts';
import { lightingLayoutInputSchema } from '../src/lib/schemas/lighting-layout.ts';
import { DEMO_ACCOUNTS, DEMO_JURISDICTION, DEMO_FIRM } from './data/demo-accounts.ts';
import { DEMO_JOB_DOCUMENT, DEMO_JOB_EXTRAS } from './data/demo-job.ts';

/** The demo job at the demo homeowner's house, for the demo firm, in the demo jurisdiction. */
export async function seed(knex: Knex): Promise<void> {
	if (process.env.NODE_ENV === 'production' && process.env.AMPLEDGER_ALLOW_DEMO !== '1') {
		throw new Error(
			'The demo seed is not for production databases (set AMPLEDGER_ALLOW_DEMO=1 to override).',
		);
	}
	await knex.raw(
		'TRUNCATE audit_log, load_rooms, loads, circuit_rooms, circuits, panels, rooms, jobs CASCADE',
	);
	const owner = await knex('users').where({ email: DEMO_ACCOUNTS.owner.email }).first('id');
	const firm = await knex('firms').where({ name: DEMO_FIRM.name }).first('id');
	const jurisdiction = await knex('jurisdictions').where({ name: DEMO_JURISDICTION.name }).first('id');
	const { job } = await importJob(knex, { id: owner.id }, firm.id, DEMO_JOB_DOCUMENT);
	await knex('jobs').where({ id: job.id }).update({
		jurisdiction_id: jurisdiction.id,
		homeowner_name: DEMO_JOB_EXTRAS.homeownerName,
		homeowner_email: DEMO_JOB_EXTRAS.homeownerEmail,
		scope_of_work: DEMO_JOB_EXTRAS.scopeOfWork,
		permit_number: DEMO_JOB_EXTRAS.permitNumber,
		status: DEMO_JOB_EXTRAS.status,
	});
	// The remodel's eight kitchen fixtures, kept as a layout so that the packet draws them to scale.
	const kitchen = await knex('rooms').where({ job_id: job.id, name: 'Kitchen' }).first('id');
	await createLightingLayout(
		knex,
		job.id,
		owner.id,
		lightingLayoutInputSchema.parse({
			title: 'Kitchen recessed lights',
			roomId: kitchen?.id ?? null,
			input: {
				lengthFt: 16,
				widthFt: 14,
				ceilingHeightFt: 9,
				fixtureDiameterIn: 4,
				spacing: { rule: 'count', rows: 2, columns: 4 },
				joists: { direction: 'along-width', spacingIn: 16, firstOffsetIn: 16 },
			},
		}),
	);
}

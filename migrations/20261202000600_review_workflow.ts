import type { Knex } from 'knex';

/**
 * Permit submission, plan review and inspections: jurisdiction settings and staff roles, the
 * server-owned job status, immutable submitted revisions, review comments with their threads,
 * inspections with correction items and photos, permit number counters.
 */

// The lists are written out here on purpose: a migration must not change when the app code does.
const OLD_STATUSES = [
	'draft',
	'in-progress',
	'submitted',
	'corrections',
	'approved',
	'rough-in-passed',
	'final-passed',
	'closed',
];
const NEW_STATUSES = [
	'draft',
	'submitted',
	'in-review',
	'corrections',
	'resubmitted',
	'approved',
	'rough-in-passed',
	'rough-in-failed',
	'final-passed',
	'final-failed',
	'closed',
	'withdrawn',
];
const NEW_ENTITIES = ['status', 'revision', 'comment', 'inspection'];
const NEW_ACTIONS = ['submit', 'transition', 'reply', 'decide', 'schedule', 'record'];

const list = (values: string[]) => values.map((v) => `'${v}'`).join(', ');

async function checkValues(knex: Knex, name: string): Promise<string[]> {
	const { rows } = await knex.raw<{ rows: { def: string }[] }>(
		'SELECT pg_get_constraintdef(oid) AS def FROM pg_constraint WHERE conname = ?',
		[name],
	);
	return [...(rows[0]?.def ?? '').matchAll(/'([a-z_-]+)'/g)].map((m) => m[1]!);
}

async function setCheck(knex: Knex, table: string, name: string, column: string, values: string[]) {
	await knex.raw(`ALTER TABLE ${table} DROP CONSTRAINT IF EXISTS ${name}`);
	await knex.raw(`ALTER TABLE ${table} ADD CONSTRAINT ${name} CHECK (${column} IN (${list(values)}))`);
}

export async function up(knex: Knex): Promise<void> {
	// Jurisdictions: settings of the AHJ, edited by its administrators.
	await knex.schema.alterTable('jurisdictions', (t) => {
		t.integer('fee_base_cents').notNullable().defaultTo(0);
		t.integer('fee_per_circuit_cents').notNullable().defaultTo(0);
		t.integer('fee_per_panel_cents').notNullable().defaultTo(0);
		t.integer('fee_service_change_cents').notNullable().defaultTo(0);
		t.jsonb('required_documents')
			.notNullable()
			.defaultTo(knex.raw(`'{"panelSchedules": true, "loadCalculation": true, "sketch": false}'::jsonb`));
		t.jsonb('amendments').notNullable().defaultTo(knex.raw(`'{}'::jsonb`));
		t.string('permit_number_pattern', 60).notNullable().defaultTo('E{YYYY}-{SEQ:5}');
		t.integer('version').notNullable().defaultTo(1);
	});
	await knex.raw(`ALTER TABLE jurisdictions
		ADD CONSTRAINT jurisdictions_fees_check CHECK (
			fee_base_cents BETWEEN 0 AND 100000000 AND fee_per_circuit_cents BETWEEN 0 AND 100000000
			AND fee_per_panel_cents BETWEEN 0 AND 100000000 AND fee_service_change_cents BETWEEN 0 AND 100000000),
		ADD CONSTRAINT jurisdictions_version_check CHECK (version >= 1)`);

	await knex.schema.alterTable('jurisdiction_inspectors', (t) => {
		t.string('staff_role', 13).notNullable().defaultTo('inspector');
	});
	await knex.raw(`ALTER TABLE jurisdiction_inspectors
		ADD CONSTRAINT jurisdiction_staff_role_check CHECK (staff_role IN ('inspector', 'administrator'))`);

	await knex.schema.createTable('permit_counters', (t) => {
		t.uuid('jurisdiction_id').notNullable().references('jurisdictions.id').onDelete('CASCADE');
		t.string('period', 8).notNullable();
		t.integer('last').notNullable().defaultTo(0);
		t.primary(['jurisdiction_id', 'period']);
	});

	// Jobs: the status is the server's, moved only along the workflow's transitions.
	await knex.raw('ALTER TABLE jobs DROP CONSTRAINT IF EXISTS jobs_status_check');
	await knex('jobs').where({ status: 'in-progress' }).update({ status: 'draft' });
	await knex.raw(
		`ALTER TABLE jobs ADD CONSTRAINT jobs_status_check CHECK (status IN (${list(NEW_STATUSES)}))`,
	);
	await knex.schema.alterTable('jobs', (t) => {
		t.uuid('assigned_inspector_id').nullable().references('users.id').onDelete('SET NULL');
		t.timestamp('submitted_at', { useTz: true }).nullable();
		t.integer('current_revision').notNullable().defaultTo(0);
		t.index(['jurisdiction_id', 'status', 'submitted_at']);
	});

	// Submitted revisions: what the reviewer received, byte for byte. Never changed once stored.
	await knex.schema.createTable('job_revisions', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('job_id').notNullable().references('jobs.id').onDelete('CASCADE');
		t.integer('number').notNullable();
		t.text('document_json').notNullable();
		t.string('document_sha256', 64).notNullable();
		t.text('results_json').notNullable();
		t.string('results_sha256', 64).notNullable();
		t.binary('packet_pdf').notNullable();
		t.string('packet_sha256', 64).notNullable();
		t.integer('packet_pages').notNullable();
		// Facts printed on the packet beside the document (job name, firm, jurisdiction, ...).
		t.jsonb('facts').notNullable().defaultTo(knex.raw(`'{}'::jsonb`));
		// The contractor's explanation of each error-level finding left in the submission.
		t.jsonb('explanations').notNullable().defaultTo(knex.raw(`'[]'::jsonb`));
		t.text('note').notNullable().defaultTo('');
		t.uuid('submitted_by').nullable().references('users.id').onDelete('SET NULL');
		t.timestamp('submitted_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.unique(['job_id', 'number']);
	});
	await knex.raw(`ALTER TABLE job_revisions
		ADD CONSTRAINT job_revisions_number_check CHECK (number >= 1),
		ADD CONSTRAINT job_revisions_sha_check CHECK (
			document_sha256 ~ '^[0-9a-f]{64}$' AND results_sha256 ~ '^[0-9a-f]{64}$' AND packet_sha256 ~ '^[0-9a-f]{64}$')`);
	await knex.raw(`
		CREATE FUNCTION job_revisions_immutable() RETURNS trigger LANGUAGE plpgsql AS $$
		BEGIN
			IF TG_OP = 'DELETE' AND NOT EXISTS (SELECT 1 FROM jobs WHERE id = OLD.job_id) THEN
				-- Only the cascade of a job row that is already gone removes its revisions.
				RETURN OLD;
			END IF;
			RAISE EXCEPTION 'a submitted revision cannot be changed or deleted'
				USING ERRCODE = 'integrity_constraint_violation';
		END $$`);
	await knex.raw(`CREATE TRIGGER job_revisions_immutable BEFORE UPDATE OR DELETE ON job_revisions
		FOR EACH ROW EXECUTE FUNCTION job_revisions_immutable()`);

	// Review comments, pinned to a sheet (and a point on it), a panel, a circuit, or the job.
	await knex.schema.createTable('review_comments', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.bigIncrements('seq', { primaryKey: false });
		t.uuid('job_id').notNullable().references('jobs.id').onDelete('CASCADE');
		t.integer('revision_number').notNullable();
		t.uuid('author_id').nullable().references('users.id').onDelete('SET NULL');
		t.string('target_kind', 8).notNullable();
		t.integer('sheet');
		t.double('point_x');
		t.double('point_y');
		// Panels and circuits may later be deleted from the live job: keep their id and label.
		t.uuid('panel_id');
		t.uuid('circuit_id');
		t.string('target_label', 200).notNullable().defaultTo('');
		t.text('body').notNullable();
		t.string('status', 10).notNullable().defaultTo('open');
		t.integer('version').notNullable().defaultTo(1);
		t.timestamps(true, true);
		t.index(['job_id', 'seq']);
	});
	await knex.raw(`ALTER TABLE review_comments
		ADD CONSTRAINT review_comments_kind_check CHECK (target_kind IN ('sheet', 'panel', 'circuit', 'job')),
		ADD CONSTRAINT review_comments_status_check CHECK (status IN ('open', 'addressed', 'resolved')),
		ADD CONSTRAINT review_comments_sheet_check CHECK (
			(target_kind = 'sheet') = (sheet IS NOT NULL) AND (sheet IS NULL OR sheet >= 1)),
		ADD CONSTRAINT review_comments_point_check CHECK (
			(point_x IS NULL) = (point_y IS NULL) AND (point_x IS NULL OR target_kind = 'sheet')
			AND (point_x IS NULL OR (point_x BETWEEN 0 AND 1 AND point_y BETWEEN 0 AND 1))),
		ADD CONSTRAINT review_comments_panel_check CHECK ((target_kind = 'panel') <= (panel_id IS NOT NULL)),
		ADD CONSTRAINT review_comments_circuit_check CHECK ((target_kind = 'circuit') = (circuit_id IS NOT NULL)),
		ADD CONSTRAINT review_comments_body_check CHECK (length(body) BETWEEN 1 AND 4000),
		ADD CONSTRAINT review_comments_version_check CHECK (version >= 1)`);

	await knex.schema.createTable('review_comment_entries', (t) => {
		t.bigIncrements('id');
		t.uuid('comment_id').notNullable().references('review_comments.id').onDelete('CASCADE');
		t.uuid('author_id').nullable().references('users.id').onDelete('SET NULL');
		t.string('action', 10).notNullable();
		t.text('body').notNullable().defaultTo('');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['comment_id', 'id']);
	});
	await knex.raw(`ALTER TABLE review_comment_entries
		ADD CONSTRAINT review_comment_entries_action_check CHECK (action IN ('reply', 'addressed', 'resolved', 'reopened')),
		ADD CONSTRAINT review_comment_entries_body_check CHECK (length(body) <= 4000)`);

	// Inspections after approval: requested by the contractor, scheduled and recorded by the inspector.
	await knex.schema.createTable('inspections', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.bigIncrements('seq', { primaryKey: false });
		t.uuid('job_id').notNullable().references('jobs.id').onDelete('CASCADE');
		t.string('kind', 8).notNullable();
		t.string('status', 10).notNullable().defaultTo('requested');
		t.jsonb('preferred_dates').notNullable().defaultTo(knex.raw(`'[]'::jsonb`));
		t.text('request_note').notNullable().defaultTo('');
		t.uuid('requested_by').nullable().references('users.id').onDelete('SET NULL');
		t.timestamp('requested_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.date('scheduled_for');
		t.uuid('inspector_id').nullable().references('users.id').onDelete('SET NULL');
		t.text('result_notes').notNullable().defaultTo('');
		t.uuid('recorded_by').nullable().references('users.id').onDelete('SET NULL');
		t.timestamp('recorded_at', { useTz: true });
		t.integer('version').notNullable().defaultTo(1);
		t.timestamps(true, true);
		t.index(['job_id', 'seq']);
	});
	await knex.raw(`ALTER TABLE inspections
		ADD CONSTRAINT inspections_kind_check CHECK (kind IN ('rough-in', 'final')),
		ADD CONSTRAINT inspections_status_check CHECK (status IN ('requested', 'scheduled', 'passed', 'failed', 'cancelled')),
		ADD CONSTRAINT inspections_scheduled_check CHECK (status IN ('requested', 'cancelled') OR scheduled_for IS NOT NULL),
		ADD CONSTRAINT inspections_recorded_check CHECK ((status IN ('passed', 'failed')) = (recorded_at IS NOT NULL)),
		ADD CONSTRAINT inspections_version_check CHECK (version >= 1)`);
	// One open request of each kind per job at a time.
	await knex.raw(`CREATE UNIQUE INDEX inspections_one_open_per_kind ON inspections (job_id, kind)
		WHERE status IN ('requested', 'scheduled')`);

	await knex.schema.createTable('inspection_items', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.bigIncrements('seq', { primaryKey: false });
		t.uuid('inspection_id').notNullable().references('inspections.id').onDelete('CASCADE');
		t.uuid('job_id').notNullable().references('jobs.id').onDelete('CASCADE');
		t.text('body').notNullable();
		t.string('status', 8).notNullable().defaultTo('open');
		t.text('answer').notNullable().defaultTo('');
		t.uuid('answered_by').nullable().references('users.id').onDelete('SET NULL');
		t.timestamp('answered_at', { useTz: true });
		t.integer('version').notNullable().defaultTo(1);
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['inspection_id', 'seq']);
		t.index(['job_id']);
	});
	await knex.raw(`ALTER TABLE inspection_items
		ADD CONSTRAINT inspection_items_status_check CHECK (status IN ('open', 'answered')),
		ADD CONSTRAINT inspection_items_body_check CHECK (length(body) BETWEEN 1 AND 4000),
		ADD CONSTRAINT inspection_items_version_check CHECK (version >= 1)`);

	await knex.schema.createTable('inspection_photos', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.bigIncrements('seq', { primaryKey: false });
		t.uuid('inspection_id').notNullable().references('inspections.id').onDelete('CASCADE');
		t.uuid('job_id').notNullable().references('jobs.id').onDelete('CASCADE');
		t.string('caption', 200).notNullable().defaultTo('');
		t.string('original_name', 255).notNullable();
		t.string('stored_name', 60).notNullable().unique();
		t.string('content_type', 40).notNullable();
		t.integer('size_bytes').notNullable();
		t.string('sha256', 64).notNullable();
		t.integer('width').notNullable();
		t.integer('height').notNullable();
		t.boolean('has_thumbnail').notNullable().defaultTo(false);
		t.uuid('uploaded_by').nullable().references('users.id').onDelete('SET NULL');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['inspection_id', 'seq']);
	});
	await knex.raw(`ALTER TABLE inspection_photos
		ADD CONSTRAINT inspection_photos_size_check CHECK (size_bytes > 0),
		ADD CONSTRAINT inspection_photos_type_check CHECK (content_type IN ('image/png', 'image/jpeg')),
		ADD CONSTRAINT inspection_photos_sha256_check CHECK (sha256 ~ '^[0-9a-f]{64}$'),
		ADD CONSTRAINT inspection_photos_stored_name_check CHECK (stored_name ~ '^[0-9a-f-]{36}\\.(png|jpg)$')`);

	// The audit trail also records workflow moves, submissions, comments and inspections.
	await setCheck(knex, 'audit_log', 'audit_entity_check', 'entity', [
		...new Set([...(await checkValues(knex, 'audit_entity_check')), ...NEW_ENTITIES]),
	]);
	await setCheck(knex, 'audit_log', 'audit_action_check', 'action', [
		...new Set([...(await checkValues(knex, 'audit_action_check')), ...NEW_ACTIONS]),
	]);
}

export async function down(knex: Knex): Promise<void> {
	await knex('audit_log').whereIn('entity', NEW_ENTITIES).orWhereIn('action', NEW_ACTIONS).delete();
	await setCheck(
		knex,
		'audit_log',
		'audit_action_check',
		'action',
		(await checkValues(knex, 'audit_action_check')).filter((a) => !NEW_ACTIONS.includes(a)),
	);
	await setCheck(
		knex,
		'audit_log',
		'audit_entity_check',
		'entity',
		(await checkValues(knex, 'audit_entity_check')).filter((e) => !NEW_ENTITIES.includes(e)),
	);
	await knex.schema.dropTableIfExists('inspection_photos');
	await knex.schema.dropTableIfExists('inspection_items');
	await knex.schema.dropTableIfExists('inspections');
	await knex.schema.dropTableIfExists('review_comment_entries');
	await knex.schema.dropTableIfExists('review_comments');
	await knex.raw('DROP TABLE IF EXISTS job_revisions');
	await knex.raw('DROP FUNCTION IF EXISTS job_revisions_immutable()');

	await knex.schema.alterTable('jobs', (t) => {
		t.dropIndex(['jurisdiction_id', 'status', 'submitted_at']);
		t.dropColumn('assigned_inspector_id');
		t.dropColumn('submitted_at');
		t.dropColumn('current_revision');
	});
	await knex.raw('ALTER TABLE jobs DROP CONSTRAINT IF EXISTS jobs_status_check');
	// The nearest status the first workflow had for each of the new ones.
	const back: Record<string, string> = {
		'in-review': 'submitted',
		resubmitted: 'submitted',
		'rough-in-failed': 'approved',
		'final-failed': 'rough-in-passed',
		withdrawn: 'draft',
	};
	for (const [from, to] of Object.entries(back))
		await knex('jobs').where({ status: from }).update({ status: to });
	await knex.raw(
		`ALTER TABLE jobs ADD CONSTRAINT jobs_status_check CHECK (status IN (${list(OLD_STATUSES)}))`,
	);

	await knex.schema.dropTableIfExists('permit_counters');
	await knex.raw(
		'ALTER TABLE jurisdiction_inspectors DROP CONSTRAINT IF EXISTS jurisdiction_staff_role_check',
	);
	await knex.schema.alterTable('jurisdiction_inspectors', (t) => {
		t.dropColumn('staff_role');
	});
	await knex.raw('ALTER TABLE jurisdictions DROP CONSTRAINT IF EXISTS jurisdictions_fees_check');
	await knex.raw('ALTER TABLE jurisdictions DROP CONSTRAINT IF EXISTS jurisdictions_version_check');
	await knex.schema.alterTable('jurisdictions', (t) => {
		for (const c of [
			'fee_base_cents',
			'fee_per_circuit_cents',
			'fee_per_panel_cents',
			'fee_service_change_cents',
			'required_documents',
			'amendments',
			'permit_number_pattern',
			'version',
		])
			t.dropColumn(c);
	});
}

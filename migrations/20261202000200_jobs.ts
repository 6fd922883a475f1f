import type { Knex } from 'knex';

const JOB_STATUSES = [
	'draft',
	'in-progress',
	'submitted',
	'corrections',
	'approved',
	'rough-in-passed',
	'final-passed',
	'closed',
];
const ROOM_TYPES = [
	'kitchen',
	'bathroom',
	'bedroom',
	'living',
	'dining',
	'hallway',
	'closet',
	'laundry',
	'garage',
	'basement',
	'outdoor',
	'attic',
	'crawl-space',
	'other',
];
const LOAD_KINDS = [
	'lighting',
	'receptacles',
	'small-appliance',
	'laundry',
	'fixed-appliance',
	'motor',
	'hvac-heat',
	'hvac-cool',
	'heat-pump',
	'water-heater',
	'range',
	'dryer',
	'ev-charger',
	'other',
];
const VOLTAGE_SYSTEMS = ['120/240-1ph-3w', '208Y/120-3ph-4w'];

const list = (values: string[]) => values.map((v) => `'${v}'`).join(', ');

/** Jobs with their rooms, panelboards, circuits and loads, and the audit trail of changes. */
export async function up(knex: Knex): Promise<void> {
	// Exclusion constraints over (uuid, int, range) need btree_gist (a trusted contrib extension).
	await knex.raw('CREATE EXTENSION IF NOT EXISTS btree_gist');

	await knex.schema.createTable('jobs', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('firm_id').notNullable().references('firms.id').onDelete('CASCADE');
		t.uuid('property_id').references('properties.id').onDelete('SET NULL');
		t.string('name', 200).notNullable();
		t.string('address', 300).notNullable().defaultTo('');
		t.string('homeowner_name', 120).notNullable().defaultTo('');
		t.string('homeowner_email', 254).notNullable().defaultTo('');
		t.uuid('jurisdiction_id').references('jurisdictions.id').onDelete('SET NULL');
		t.string('code_edition', 4).notNullable();
		t.text('scope_of_work').notNullable().defaultTo('');
		t.string('permit_number', 60).notNullable().defaultTo('');
		t.string('status', 20).notNullable().defaultTo('draft');
		t.integer('service_rating_a').notNullable();
		t.string('voltage_system', 20).notNullable();
		t.integer('terminal_temperature_c').notNullable().defaultTo(75);
		t.double('floor_area_ft2');
		t.double('existing_peak_demand_kw');
		t.integer('version').notNullable().defaultTo(1);
		t.uuid('created_by').references('users.id').onDelete('SET NULL');
		t.timestamps(true, true);
		t.timestamp('deleted_at', { useTz: true });
		t.index(['firm_id', 'deleted_at']);
		t.index(['property_id']);
	});
	await knex.raw(`ALTER TABLE jobs
		ADD CONSTRAINT jobs_edition_check CHECK (code_edition IN ('2017', '2020', '2023')),
		ADD CONSTRAINT jobs_status_check CHECK (status IN (${list(JOB_STATUSES)})),
		ADD CONSTRAINT jobs_service_rating_check CHECK (service_rating_a > 0),
		ADD CONSTRAINT jobs_voltage_system_check CHECK (voltage_system IN (${list(VOLTAGE_SYSTEMS)})),
		ADD CONSTRAINT jobs_terminal_check CHECK (terminal_temperature_c IN (60, 75, 90)),
		ADD CONSTRAINT jobs_floor_area_check CHECK (floor_area_ft2 IS NULL OR floor_area_ft2 > 0),
		ADD CONSTRAINT jobs_peak_check CHECK (existing_peak_demand_kw IS NULL OR existing_peak_demand_kw > 0),
		ADD CONSTRAINT jobs_version_check CHECK (version >= 1)`);

	await knex.schema.createTable('rooms', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		// Keeps the order records were entered or imported in (created_at is one value per transaction).
		t.bigIncrements('seq', { primaryKey: false });
		t.uuid('job_id').notNullable().references('jobs.id').onDelete('CASCADE');
		t.string('name', 200).notNullable();
		t.string('type', 20).notNullable();
		t.integer('floor').notNullable().defaultTo(1);
		t.double('area_ft2').notNullable().defaultTo(0);
		t.boolean('in_floor_area');
		t.integer('version').notNullable().defaultTo(1);
		t.timestamps(true, true);
		t.index(['job_id']);
	});
	await knex.raw(`ALTER TABLE rooms
		ADD CONSTRAINT rooms_type_check CHECK (type IN (${list(ROOM_TYPES)})),
		ADD CONSTRAINT rooms_area_check CHECK (area_ft2 >= 0),
		ADD CONSTRAINT rooms_version_check CHECK (version >= 1)`);

	await knex.schema.createTable('panels', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		// Keeps the order records were entered or imported in (created_at is one value per transaction).
		t.bigIncrements('seq', { primaryKey: false });
		t.uuid('job_id').notNullable().references('jobs.id').onDelete('CASCADE');
		t.string('name', 200).notNullable();
		t.string('location', 200).notNullable().defaultTo('');
		t.string('kind', 4).notNullable();
		t.uuid('fed_from_circuit_id');
		t.string('voltage_system', 20).notNullable();
		t.integer('bus_rating_a').notNullable();
		t.integer('main_breaker_a');
		t.integer('spaces').notNullable();
		t.integer('version').notNullable().defaultTo(1);
		t.timestamps(true, true);
		t.index(['job_id']);
	});
	await knex.raw(`ALTER TABLE panels
		ADD CONSTRAINT panels_kind_check CHECK (kind IN ('main', 'sub')),
		ADD CONSTRAINT panels_main_not_fed_check CHECK (kind = 'sub' OR fed_from_circuit_id IS NULL),
		ADD CONSTRAINT panels_voltage_system_check CHECK (voltage_system IN (${list(VOLTAGE_SYSTEMS)})),
		ADD CONSTRAINT panels_bus_check CHECK (bus_rating_a > 0),
		ADD CONSTRAINT panels_main_breaker_check CHECK (main_breaker_a IS NULL OR main_breaker_a > 0),
		ADD CONSTRAINT panels_spaces_check CHECK (spaces BETWEEN 2 AND 84),
		ADD CONSTRAINT panels_version_check CHECK (version >= 1)`);

	await knex.schema.createTable('circuits', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('panel_id').notNullable().references('panels.id').onDelete('CASCADE');
		t.integer('position').notNullable();
		t.integer('poles').notNullable().defaultTo(1);
		t.integer('rating_a').notNullable();
		t.string('breaker_type', 20).notNullable().defaultTo('standard');
		t.string('conductor_size', 4).notNullable();
		t.string('conductor_material', 2).notNullable();
		t.integer('conductor_insulation_c').notNullable();
		t.double('length_ft').notNullable().defaultTo(0);
		t.string('label', 200).notNullable().defaultTo('');
		t.string('status', 10).notNullable().defaultTo('new');
		t.uuid('multiwire_with_id').references('circuits.id').onDelete('SET NULL');
		t.boolean('gfci_at_device').notNullable().defaultTo(false);
		t.boolean('afci_at_device').notNullable().defaultTo(false);
		t.integer('version').notNullable().defaultTo(1);
		t.timestamps(true, true);
		t.index(['panel_id']);
	});
	await knex.raw(`ALTER TABLE circuits
		ADD CONSTRAINT circuits_position_check CHECK (position >= 1),
		ADD CONSTRAINT circuits_poles_check CHECK (poles IN (1, 2, 3)),
		ADD CONSTRAINT circuits_rating_check CHECK (rating_a > 0),
		ADD CONSTRAINT circuits_breaker_type_check CHECK (breaker_type IN ('standard', 'afci', 'gfci', 'dual-function', 'gfpe')),
		ADD CONSTRAINT circuits_material_check CHECK (conductor_material IN ('cu', 'al')),
		ADD CONSTRAINT circuits_insulation_check CHECK (conductor_insulation_c IN (60, 75, 90)),
		ADD CONSTRAINT circuits_length_check CHECK (length_ft >= 0),
		ADD CONSTRAINT circuits_status_check CHECK (status IN ('existing', 'new', 'modified', 'removed')),
		ADD CONSTRAINT circuits_version_check CHECK (version >= 1)`);
	// A breaker at p with n poles takes p, p+2, ...: the rows ceil(p/2) .. ceil(p/2)+n-1 on the side p % 2.
	// Two breakers of a panel may not share a row on the same side.
	await knex.raw(`ALTER TABLE circuits ADD CONSTRAINT circuits_positions_free EXCLUDE USING gist (
		panel_id WITH =,
		(position % 2) WITH =,
		int4range((position + 1) / 2, (position + 1) / 2 + poles) WITH &&
	)`);
	// A CHECK cannot see the panel's spaces; these triggers keep every breaker inside its panel.
	await knex.raw(`
		CREATE FUNCTION circuits_within_spaces() RETURNS trigger LANGUAGE plpgsql AS $$
		DECLARE panel_spaces integer;
		BEGIN
			SELECT spaces INTO panel_spaces FROM panels WHERE id = NEW.panel_id;
			IF NEW.position + 2 * (NEW.poles - 1) > panel_spaces THEN
				RAISE EXCEPTION 'circuit at position % with % poles does not fit a panel of % spaces', NEW.position, NEW.poles, panel_spaces
					USING ERRCODE = 'check_violation', CONSTRAINT = 'circuits_within_spaces';
			END IF;
			RETURN NEW;
		END $$;
		CREATE TRIGGER circuits_within_spaces BEFORE INSERT OR UPDATE OF position, poles, panel_id ON circuits
			FOR EACH ROW EXECUTE FUNCTION circuits_within_spaces();
		CREATE FUNCTION panels_spaces_hold_circuits() RETURNS trigger LANGUAGE plpgsql AS $$
		BEGIN
			IF EXISTS (SELECT 1 FROM circuits WHERE panel_id = NEW.id AND position + 2 * (poles - 1) > NEW.spaces) THEN
				RAISE EXCEPTION 'panel % has breakers beyond % spaces', NEW.id, NEW.spaces
					USING ERRCODE = 'check_violation', CONSTRAINT = 'panels_spaces_hold_circuits';
			END IF;
			RETURN NEW;
		END $$;
		CREATE TRIGGER panels_spaces_hold_circuits BEFORE UPDATE OF spaces ON panels
			FOR EACH ROW EXECUTE FUNCTION panels_spaces_hold_circuits();
	`);
	// Added once circuits exist; a circuit feeds at most one panel, and may not be deleted while it does.
	await knex.schema.alterTable('panels', (t) => {
		t.foreign('fed_from_circuit_id').references('circuits.id').onDelete('NO ACTION');
		t.unique(['fed_from_circuit_id']);
	});

	await knex.schema.createTable('circuit_rooms', (t) => {
		t.uuid('circuit_id').notNullable().references('circuits.id').onDelete('CASCADE');
		t.uuid('room_id').notNullable().references('rooms.id').onDelete('CASCADE');
		t.integer('ordinal').notNullable().defaultTo(0);
		t.primary(['circuit_id', 'room_id']);
		t.index(['room_id']);
	});

	await knex.schema.createTable('loads', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		// Keeps the order records were entered or imported in (created_at is one value per transaction).
		t.bigIncrements('seq', { primaryKey: false });
		t.uuid('circuit_id').notNullable().references('circuits.id').onDelete('CASCADE');
		t.string('kind', 20).notNullable();
		t.string('description', 200).notNullable().defaultTo('');
		t.integer('quantity').notNullable().defaultTo(1);
		t.double('va');
		t.double('watts');
		t.string('hp', 8);
		t.integer('voltage').notNullable();
		t.boolean('continuous').notNullable().defaultTo(false);
		t.boolean('cord_and_plug').notNullable().defaultTo(false);
		t.string('status', 10);
		t.string('space_heating', 30);
		t.integer('version').notNullable().defaultTo(1);
		t.timestamps(true, true);
		t.index(['circuit_id']);
	});
	await knex.raw(`ALTER TABLE loads
		ADD CONSTRAINT loads_kind_check CHECK (kind IN (${list(LOAD_KINDS)})),
		ADD CONSTRAINT loads_quantity_check CHECK (quantity >= 1),
		ADD CONSTRAINT loads_rating_check CHECK (num_nonnulls(va, watts, hp) = 1 AND coalesce(va, 1) > 0 AND coalesce(watts, 1) > 0),
		ADD CONSTRAINT loads_voltage_check CHECK (voltage IN (120, 208, 240)),
		ADD CONSTRAINT loads_status_check CHECK (status IS NULL OR status IN ('existing', 'new')),
		ADD CONSTRAINT loads_space_heating_check CHECK (space_heating IS NULL OR kind = 'hvac-heat'),
		ADD CONSTRAINT loads_version_check CHECK (version >= 1)`);

	await knex.schema.createTable('load_rooms', (t) => {
		t.uuid('load_id').notNullable().references('loads.id').onDelete('CASCADE');
		t.uuid('room_id').notNullable().references('rooms.id').onDelete('CASCADE');
		t.integer('ordinal').notNullable().defaultTo(0);
		t.primary(['load_id', 'room_id']);
		t.index(['room_id']);
	});

	// No foreign key to the entity: the trail outlives what it describes.
	await knex.schema.createTable('audit_log', (t) => {
		t.bigIncrements('id');
		t.uuid('job_id').notNullable().references('jobs.id').onDelete('CASCADE');
		t.uuid('user_id').references('users.id').onDelete('SET NULL');
		t.string('entity', 10).notNullable();
		t.uuid('entity_id').notNullable();
		t.string('action', 10).notNullable();
		t.jsonb('before');
		t.jsonb('after');
		t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['job_id', 'at']);
	});
	await knex.raw(`ALTER TABLE audit_log
		ADD CONSTRAINT audit_entity_check CHECK (entity IN ('job', 'room', 'panel', 'circuit', 'load')),
		ADD CONSTRAINT audit_action_check CHECK (action IN ('create', 'update', 'delete', 'move', 'import'))`);
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('audit_log');
	await knex.schema.dropTableIfExists('load_rooms');
	await knex.schema.dropTableIfExists('loads');
	await knex.schema.dropTableIfExists('circuit_rooms');
	await knex.schema.alterTable('panels', (t) => {
		t.dropForeign(['fed_from_circuit_id']);
	});
	await knex.schema.dropTableIfExists('circuits');
	await knex.raw('DROP FUNCTION IF EXISTS circuits_within_spaces()');
	await knex.schema.dropTableIfExists('panels');
	await knex.raw('DROP FUNCTION IF EXISTS panels_spaces_hold_circuits()');
	await knex.schema.dropTableIfExists('rooms');
	await knex.schema.dropTableIfExists('jobs');
	await knex.raw('DROP EXTENSION IF EXISTS btree_gist');
}

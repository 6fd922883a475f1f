/**
 * The job document: one zod schema per entity, shared by the engine, the web forms and the API.
 * Field messages are written for people; parseJobDocument adds the field path in front.
 */
import { z } from 'zod';
import { BREAKER_RATINGS_A, CONDUCTOR_SIZES, MOTOR_HP, STANDARD_RATINGS_A } from './tables';

const shown = (input: unknown): string => (typeof input === 'string' ? `"${input}"` : String(input));
const isMissing = (input: unknown): boolean => input === undefined;

/** Message helper: a fixed text for a missing field, another for a present but wrong value. */
function says(wrong: (input: unknown) => string, missing = 'is required') {
	return { error: (iss: { input?: unknown }) => (isMissing(iss.input) ? missing : wrong(iss.input)) };
}

const idSchema = z
	.string(says(() => 'must be a text identifier'))
	.min(1, { error: 'must not be empty' })
	.max(100, { error: 'must be at most 100 characters' });

const finite = (what: string) => z.number(says((v) => `${shown(v)} is not a number; give ${what}`));

export const EDITIONS = ['2017', '2020', '2023'] as const;
export const VOLTAGE_SYSTEMS = ['120/240-1ph-3w', '208Y/120-3ph-4w'] as const;
export const ROOM_TYPES = [
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
] as const;
export const BREAKER_TYPES = ['standard', 'afci', 'gfci', 'dual-function', 'gfpe'] as const;
export const CIRCUIT_STATUSES = ['existing', 'new', 'modified', 'removed'] as const;
export const LOAD_KINDS = [
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
] as const;
export const SPACE_HEATING_TYPES = [
	'central',
	'room-units',
	'heat-pump-supplemental',
	'thermal-storage',
] as const;

const enumOf = <T extends readonly [string, ...string[]]>(values: T, what: string) =>
	z.enum(
		values,
		says((v) => `${shown(v)} is not ${what}; use one of ${values.join(', ')}`),
	);

export const voltageSystemSchema = enumOf(VOLTAGE_SYSTEMS, 'a voltage system').describe(
	"'120/240-1ph-3w': 120/240 V single-phase 3-wire; '208Y/120-3ph-4w': 208Y/120 V three-phase 4-wire",
);

const breakerRatingSchema = z.literal(
	BREAKER_RATINGS_A,
	says((v) =>
		typeof v === 'number'
			? `${v} A is not a standard breaker rating (NEC 240.6(A))`
			: `${shown(v)} is not a number of amperes`,
	),
);

const serviceRatingSchema = z.literal(
	STANDARD_RATINGS_A,
	says((v) =>
		typeof v === 'number'
			? `${v} A is not a standard rating (NEC 240.6(A))`
			: `${shown(v)} is not a number of amperes`,
	),
);

export const existingLoadSchema = z
	.strictObject({
		method: z
			.literal(
				'measured-peak',
				says(() => "must be 'measured-peak' (12 months of maximum demand, NEC 220.87)"),
			)
			.describe('How the existing load is known. Only measured peak demand is supported.'),
		peakDemandKW: finite('kilowatts')
			.positive({ error: 'must be more than 0 kW' })
			.max(1000, { error: 'must be at most 1000 kW' })
			.describe('Highest demand over the last 12 months, kW (utility demand data or a recorder).'),
	})
	.describe('Measured existing load (NEC 220.87). Omit when no 12-month demand record exists.');

export const serviceSchema = z
	.strictObject({
		ratingA: serviceRatingSchema.describe('Service rating in amperes (the service disconnect rating).'),
		voltageSystem: voltageSystemSchema,
		existingLoad: existingLoadSchema.nullable().default(null),
	})
	.describe('The service supplying the dwelling.');

export const roomSchema = z
	.strictObject({
		id: idSchema.describe('Identifier of the room, unique in the job.'),
		name: z.string(says(() => 'must be text')).max(200, { error: 'must be at most 200 characters' }),
		type: enumOf(ROOM_TYPES, 'a room type').describe('Room type; drives GFCI/AFCI requirements.'),
		floor: z
			.int(says((v) => `${shown(v)} is not a whole storey number`))
			.min(-5, { error: 'must be -5 or more' })
			.max(200, { error: 'must be 200 or less' })
			.default(1)
			.describe('Storey: 1 = ground floor, 0 and below = basement levels.'),
		areaFt2: finite('square feet')
			.nonnegative({ error: 'must be 0 ft² or more' })
			.max(100_000, { error: 'must be at most 100,000 ft²' })
			.describe('Floor area, ft².'),
		inFloorArea: z
			.boolean(says(() => 'must be true or false'))
			.nullable()
			.default(null)
			.describe(
				'Whether the area counts toward the general-lighting floor area. null: by type (garage, outdoor, attic and crawl space do not count).',
			),
	})
	.describe('A room or area of the dwelling.');
export type Room = z.infer<typeof roomSchema>;

export const panelSchema = z
	.strictObject({
		id: idSchema.describe('Identifier of the panelboard, unique in the job.'),
		name: z
			.string(says(() => 'must be text'))
			.min(1, { error: 'must not be empty' })
			.max(200),
		location: z
			.string(says(() => 'must be text'))
			.max(200)
			.default(''),
		kind: enumOf(['main', 'sub'] as const, 'a panel kind').describe(
			"'main': supplied by the service; 'sub': supplied by a feeder circuit of another panel.",
		),
		fedFromCircuitId: idSchema
			.nullable()
			.default(null)
			.describe('For a subpanel: the circuit (in another panel) whose breaker supplies it.'),
		voltageSystem: voltageSystemSchema,
		busRatingA: z
			.int(says((v) => `${shown(v)} is not a whole number of amperes`))
			.positive({ error: 'must be more than 0 A' })
			.max(1200, { error: 'must be at most 1200 A' })
			.describe('Bus rating, amperes.'),
		mainBreakerA: breakerRatingSchema
			.nullable()
			.describe('Main breaker rating in amperes, or null for a main-lug panelboard.'),
		spaces: z
			.int(says((v) => `${shown(v)} is not a whole number of spaces`))
			.min(2, { error: 'must be at least 2' })
			.max(84, { error: 'must be at most 84' })
			.describe('Number of breaker positions.'),
	})
	.describe('A panelboard.');
export type Panel = z.infer<typeof panelSchema>;

export const conductorSchema = z
	.strictObject({
		size: enumOf(CONDUCTOR_SIZES, 'a conductor size').describe("AWG size: '14' to '1', then '1/0' to '4/0'."),
		material: enumOf(['cu', 'al'] as const, 'a conductor material').describe("'cu' copper, 'al' aluminum."),
		insulationC: z
			.literal(
				[60, 75, 90],
				says((v) => `${shown(v)} °C is not an insulation rating; use 60, 75 or 90`),
			)
			.describe('Insulation temperature rating, °C.'),
	})
	.describe('Branch-circuit or feeder conductors.');
export type Conductor = z.infer<typeof conductorSchema>;

export const circuitSchema = z
	.strictObject({
		id: idSchema.describe('Identifier of the circuit, unique in the job.'),
		panelId: idSchema.describe('The panelboard the breaker sits in.'),
		position: z
			.int(says((v) => `${shown(v)} is not a whole position number`))
			.min(1, { error: 'must be 1 or more' })
			.max(200, { error: 'must be at most 200' })
			.describe(
				'First (lowest) position the breaker takes; a 2-pole breaker takes position and position + 2.',
			),
		poles: z
			.literal(
				[1, 2, 3],
				says((v) => `${shown(v)} is not a number of poles; use 1, 2 or 3`),
			)
			.describe('Breaker poles.'),
		ratingA: breakerRatingSchema.describe('Breaker rating, amperes (NEC 240.6(A)).'),
		breakerType: enumOf(BREAKER_TYPES, 'a breaker type')
			.default('standard')
			.describe("'dual-function' gives AFCI and GFCI; 'gfpe' is equipment protection, not personnel."),
		conductor: conductorSchema,
		lengthFt: finite('feet')
			.nonnegative({ error: 'must be 0 ft or more' })
			.max(2000, { error: 'must be at most 2000 ft' })
			.describe('One-way length of the run from the panel to the farthest outlet, ft.'),
		label: z
			.string(says(() => 'must be text'))
			.max(200, { error: 'must be at most 200 characters' })
			.describe('Circuit directory text (NEC 408.4(A)).'),
		roomIds: z
			.array(
				idSchema,
				says(() => 'must be a list of room ids'),
			)
			.default([]),
		status: enumOf(CIRCUIT_STATUSES, 'a circuit status').default('new'),
		multiwireWith: idSchema
			.nullable()
			.default(null)
			.describe('The other circuit sharing this circuit’s neutral (multiwire branch circuit), if any.'),
		gfciAtDevice: z
			.boolean(says(() => 'must be true or false'))
			.default(false)
			.describe(
				'GFCI protection given by a device (GFCI receptacle at the first outlet) instead of the breaker.',
			),
		afciAtDevice: z
			.boolean(says(() => 'must be true or false'))
			.default(false)
			.describe('AFCI protection given by an outlet branch-circuit AFCI device at the first outlet.'),
	})
	.describe('A branch circuit or feeder, identified by its breaker.');
export type Circuit = z.infer<typeof circuitSchema>;

/** The load's fields without the cross-field rules; use it to extend the entity (e.g. with a database id). */
export const loadFieldsSchema = z.strictObject({
	id: idSchema.describe('Identifier of the load, unique in the job.'),
	circuitId: idSchema.describe('The circuit supplying the load.'),
	kind: enumOf(LOAD_KINDS, 'a load kind'),
	description: z
		.string(says(() => 'must be text'))
		.max(200)
		.default(''),
	quantity: z
		.int(says((v) => `${shown(v)} is not a whole number`))
		.min(1, { error: 'must be 1 or more' })
		.max(10_000, { error: 'must be at most 10,000' })
		.default(1)
		.describe('How many identical items.'),
	va: finite('volt-amperes')
		.positive({ error: 'must be more than 0 VA' })
		.max(1_000_000, { error: 'must be at most 1,000,000 VA' })
		.nullish()
		.describe('Rating of one item in volt-amperes. Give exactly one of va, watts, hp.'),
	watts: finite('watts')
		.positive({ error: 'must be more than 0 W' })
		.max(1_000_000, { error: 'must be at most 1,000,000 W' })
		.nullish()
		.describe('Rating of one item in watts (taken as VA). Give exactly one of va, watts, hp.'),
	hp: enumOf(MOTOR_HP, 'a horsepower in Table 430.248')
		.nullish()
		.describe(
			'Motor horsepower; the current comes from NEC Table 430.248. Give exactly one of va, watts, hp.',
		),
	voltage: z
		.literal(
			[120, 208, 240],
			says((v) => `${shown(v)} V is not a supported voltage; use 120, 208 or 240`),
		)
		.describe('Rated voltage of the item.'),
	continuous: z
		.boolean(says(() => 'must be true or false'))
		.default(false)
		.describe('Runs 3 hours or more at its maximum current (NEC Article 100).'),
	cordAndPlug: z
		.boolean(says(() => 'must be true or false'))
		.default(false)
		.describe('Connected by cord and plug (a receptacle outlet) rather than fastened in place.'),
	status: enumOf(['existing', 'new'] as const, 'a load status')
		.nullable()
		.default(null)
		.describe("'new' for a load added by this job. null: new when its circuit is new, existing otherwise."),
	spaceHeating: enumOf(SPACE_HEATING_TYPES, 'a space-heating type')
		.nullable()
		.default(null)
		.describe("For 'hvac-heat' loads: what the heating is (NEC 220.82(C)). null is read as 'central'."),
	roomIds: z
		.array(
			idSchema,
			says(() => 'must be a list of room ids'),
		)
		.default([]),
});

/** A load with its cross-field rules: exactly one of va, watts, hp; spaceHeating only on heating loads. */
export const loadSchema = loadFieldsSchema
	.superRefine((load, ctx) => {
		const given = [load.va, load.watts, load.hp].filter((v) => v !== undefined && v !== null).length;
		if (given !== 1) {
			ctx.addIssue({
				code: 'custom',
				path: given === 0 ? ['va'] : [],
				message:
					given === 0
						? 'give the rating: one of va, watts or hp'
						: 'give only one of va, watts or hp, not several',
			});
		}
		if (load.spaceHeating !== null && load.kind !== 'hvac-heat') {
			ctx.addIssue({
				code: 'custom',
				path: ['spaceHeating'],
				message: "applies only to loads of kind 'hvac-heat'",
			});
		}
	})
	.describe('Something a circuit supplies.');
export type Load = z.infer<typeof loadSchema>;
/** A load as written in a file or form, before defaults. */
export type LoadInput = z.input<typeof loadSchema>;

/**
 * Local amendments the engine can apply: another edition's GFCI list (210.8(A)) or AFCI list
 * (210.12) than the job's edition. null: the job's edition.
 */
export const ruleOptionsSchema = z
	.strictObject(
		{
			gfciEdition: enumOf(EDITIONS, 'a supported code edition')
				.nullable()
				.default(null)
				.describe("Edition whose GFCI list (210.8(A)) applies. null: the job's edition."),
			afciEdition: enumOf(EDITIONS, 'a supported code edition')
				.nullable()
				.default(null)
				.describe("Edition whose AFCI list (210.12) applies. null: the job's edition."),
		},
		says(() => 'must be an object with gfciEdition and afciEdition'),
	)
	.describe('Rule options from the local amendments of the AHJ.');
export type RuleOptions = z.infer<typeof ruleOptionsSchema>;

export const jobSettingsSchema = z.strictObject({
	id: idSchema.nullable().default(null).describe('Identifier of the job, if it has one.'),
	name: z
		.string(says(() => 'must be text'))
		.min(1, { error: 'must not be empty' })
		.max(200),
	address: z
		.string(says(() => 'must be text'))
		.max(300)
		.default(''),
	codeEdition: enumOf(EDITIONS, 'a supported code edition').describe('NEC edition adopted by the AHJ.'),
	jurisdiction: z
		.strictObject(
			{
				name: z
					.string(says(() => 'must be text'))
					.trim()
					.min(1, { error: 'must not be empty' })
					.max(200, { error: 'must be at most 200 characters' })
					.describe('Name of the jurisdiction as the installation lists it.'),
			},
			says(() => 'must be an object with the name of the jurisdiction, or null'),
		)
		.nullable()
		.default(null)
		.describe('Authority having jurisdiction (AHJ) the permit is filed with. null: not chosen yet.'),
	terminalTemperatureC: z
		.literal(
			[60, 75, 90],
			says((v) => `${shown(v)} °C is not a terminal rating; use 60, 75 or 90`),
		)
		.default(75)
		.describe('Temperature rating of the breaker and device terminals, °C (NEC 110.14(C)).'),
	floorAreaFt2: finite('square feet')
		.positive({ error: 'must be more than 0 ft²' })
		.max(100_000, { error: 'must be at most 100,000 ft²' })
		.nullable()
		.default(null)
		.describe(
			'Floor area for general lighting, outside dimensions, ft². null: the sum of the rooms counted.',
		),
	ruleOptions: ruleOptionsSchema.default({ gfciEdition: null, afciEdition: null }),
	service: serviceSchema,
});
export type JobSettings = z.infer<typeof jobSettingsSchema>;

export const jobDocumentSchema = jobSettingsSchema
	.extend({
		formatVersion: z
			.literal(
				1,
				says(() => 'must be 1 (the only format version so far)'),
			)
			.describe('Version of this document format.'),
		rooms: z
			.array(
				roomSchema,
				says(() => 'must be a list'),
			)
			.default([]),
		panels: z
			.array(
				panelSchema,
				says(() => 'must be a list'),
			)
			.min(1, { error: 'must list at least one panel' }),
		circuits: z
			.array(
				circuitSchema,
				says(() => 'must be a list'),
			)
			.default([]),
		loads: z
			.array(
				loadSchema,
				says(() => 'must be a list'),
			)
			.default([]),
	})
	.describe('A residential electrical job: settings, rooms, panels, circuits and loads.');

/** A validated job document, defaults filled in. */
export type JobDocument = z.infer<typeof jobDocumentSchema>;
/** A job document as written in a file, before defaults. */
export type JobDocumentInput = z.input<typeof jobDocumentSchema>;
export type Service = z.infer<typeof serviceSchema>;
export type VoltageSystem = (typeof VOLTAGE_SYSTEMS)[number];
export type RoomType = (typeof ROOM_TYPES)[number];
export type LoadKind = (typeof LOAD_KINDS)[number];
export type BreakerType = (typeof BREAKER_TYPES)[number];

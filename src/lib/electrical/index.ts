/** The calculation engine's public API: pure TypeScript, no I/O, runs in the server, the browser and the CLI. */
export type { Edition, Figure, Finding, Leg, Line, Severity, Target, Unit } from './types';
export * from './schema';
export { parseJobDocument, crossCheck, formatPath } from './parse';
export type { ParseResult } from './parse';
export { computeJob } from './compute-job';
export type {
	JobResult,
	LegLoad,
	MethodId,
	MethodResult,
	PanelResult,
	PositionSlot,
	ServiceResult,
} from './compute-job';
export type { CircuitResult, VoltageDrop } from './circuit-checks';
export { voltageDrop } from './circuit-checks';
export {
	cookingDemand,
	lightingDemand,
	roundAmpsAnnexD,
	standardMethod,
	optionalMethod,
	existingAddedMethod,
	measuredDemandMethod,
} from './dwelling';
export { layoutRecessedLights, recessedLightLoads, recessedLayoutInputSchema } from './recessed-layout';
export type {
	FixturePosition,
	LayoutResult,
	RecessedLayout,
	RecessedLayoutInput,
	RecessedLoadOptions,
} from './recessed-layout';
export { formatJobReport } from './report-text';
export { legOf, rowOf, sideOf, positionsTaken, circuitVoltage } from './positions';
export {
	tableAmpacity,
	smallConductorLimitA,
	motorFullLoadA,
	nextStandardRatingA,
	STANDARD_RATINGS_A,
	CONDUCTOR_SIZES,
	MOTOR_HP,
} from './tables';
export type { ConductorSize, MotorHp } from './tables';
export { section } from './sections';
export { jobSchemaText } from './json-schema';

/** Small builders for job documents in tests. */
import type { JobDocumentInput } from '../../../src/lib/electrical/schema';

type CircuitIn = NonNullable<JobDocumentInput['circuits']>[number];
type LoadIn = NonNullable<JobDocumentInput['loads']>[number];

let counter = 0;

/** A 1-pole or 2-pole circuit in panel p1 with sensible defaults. */
export function circuit(over: Partial<CircuitIn> & { id: string; position: number }): CircuitIn {
	return {
		panelId: 'p1',
		poles: 1,
		ratingA: 20,
		conductor: { size: '12', material: 'cu', insulationC: 90 },
		lengthFt: 50,
		label: over.id,
		status: 'new',
		...over,
	};
}

/** A load with defaults (120 V, 1 item). */
export function load(over: Partial<LoadIn> & { circuitId: string; kind: LoadIn['kind'] }): LoadIn {
	counter++;
	return { id: `l${counter}`, voltage: 120, ...over };
}

/** A job document with one 200 A main panel of 40 spaces. */
export function job(over: Partial<JobDocumentInput> = {}): JobDocumentInput {
	return {
		formatVersion: 1,
		name: 'Test house',
		codeEdition: '2023',
		service: { ratingA: 200, voltageSystem: '120/240-1ph-3w' },
		panels: [
			{
				id: 'p1',
				name: 'Main',
				kind: 'main',
				voltageSystem: '120/240-1ph-3w',
				busRatingA: 200,
				mainBreakerA: 200,
				spaces: 40,
			},
		],
		rooms: [],
		circuits: [],
		loads: [],
		...over,
	};
}

/** Walks a value and returns the paths of any NaN, ±Infinity or undefined. */
export function badValues(value: unknown, path = '$'): string[] {
	if (value === undefined) return [path];
	if (typeof value === 'number') return Number.isFinite(value) ? [] : [path];
	if (Array.isArray(value)) return value.flatMap((v, i) => badValues(v, `${path}[${i}]`));
	// Texts such as the working are written when first read: a NaN or undefined in them is just as bad.
	if (typeof value === 'string') return /\bNaN\b|\bundefined\b|Infinity/.test(value) ? [path] : [];
	if (value !== null && typeof value === 'object') {
		// Figures and findings keep their texts in getters; toJSON gives every field as the API sends it.
		const plain =
			typeof (value as { toJSON?: unknown }).toJSON === 'function'
				? (value as { toJSON(): unknown }).toJSON()
				: value;
		return Object.entries(plain as object).flatMap(([k, v]) => badValues(v, `${path}.${k}`));
	}
	return [];
}

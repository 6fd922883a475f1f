/* eslint-disable @typescript-eslint/no-explicit-any -- tests read JSON bodies and spoil documents loosely */
import type { Knex } from 'knex';
import { HttpClient } from './http';

export type ErrorBody = {
	error: {
		code: string;
		message: string;
		fields?: Record<string, string[]>;
		current?: Record<string, unknown>;
	};
};

/** Sends a JSON request and returns status and parsed body (any body shape). */
export async function call<T = any>(
	client: HttpClient,
	method: string,
	path: string,
	body?: unknown,
): Promise<{ status: number; body: T }> {
	return client.json<T>(path, { method, body: body as never });
}

export const uniq = () => `${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 7)}`;

/** A valid new job; a unique address so that it gets its own property. */
export function newJob(overrides: Record<string, unknown> = {}) {
	return {
		name: `Test job ${uniq()}`,
		address: `${Math.floor(Math.random() * 900) + 100} Test Lane ${uniq()}, Quillmere`,
		codeEdition: '2023',
		serviceRatingA: 200,
		voltageSystem: '120/240-1ph-3w',
		...overrides,
	};
}

export const mainPanel = (overrides: Record<string, unknown> = {}) => ({
	name: 'Main panel',
	kind: 'main',
	voltageSystem: '120/240-1ph-3w',
	busRatingA: 200,
	mainBreakerA: 200,
	spaces: 20,
	...overrides,
});

export const circuitAt = (position: number, overrides: Record<string, unknown> = {}) => ({
	position,
	poles: 1,
	ratingA: 20,
	breakerType: 'afci',
	conductor: { size: '12', material: 'cu', insulationC: 90 },
	lengthFt: 40,
	label: `Circuit ${position}`,
	...overrides,
});

export const loadOf = (overrides: Record<string, unknown> = {}) => ({
	kind: 'receptacles',
	quantity: 4,
	va: 180,
	voltage: 120,
	...overrides,
});

/** Signs up a second contractor firm and returns its signed-in owner. */
export async function otherFirmOwner(): Promise<{ client: HttpClient; firmId: string; userId: string }> {
	const email = `other-${uniq()}@harrowgate.example`;
	const client = new HttpClient();
	const res = await call<{ firmId: string; userId: string }>(client, 'POST', '/api/sign-up', {
		firmName: 'Harrowgate Lane Electric',
		licenceNumber: 'EC-77/3',
		name: 'Perrin Ockley',
		email,
		password: 'correct-horse-battery',
		confirmPassword: 'correct-horse-battery',
	});
	if (res.status !== 201) throw new Error(`sign-up failed: ${res.status}`);
	const failure = await client.signIn(email, 'correct-horse-battery');
	if (failure) throw new Error(`sign-in failed: ${failure}`);
	return { client, ...res.body };
}

/** Removes the firm and the owner that otherFirmOwner signed up. */
export async function removeOtherFirm(db: Knex, other: { firmId: string; userId: string }): Promise<void> {
	await db('firms').where({ id: other.firmId }).delete();
	await db('users').where({ id: other.userId }).delete();
}

/** Every row count of the job tables, to assert that a rejected write changed nothing. */
export async function jobTableCounts(db: Knex): Promise<Record<string, number>> {
	const out: Record<string, number> = {};
	for (const t of [
		'jobs',
		'rooms',
		'panels',
		'circuits',
		'loads',
		'circuit_rooms',
		'load_rooms',
		'audit_log',
		'properties',
	]) {
		const [row] = await db(t).count<{ count: string }[]>('* as count');
		out[t] = Number(row!.count);
	}
	return out;
}

/** Removes jobs a test created, and the properties made for their addresses. */
export async function removeJobs(db: Knex, jobIds: string[]): Promise<void> {
	if (jobIds.length === 0) return;
	const propertyIds = await db('jobs').whereIn('id', jobIds).whereNotNull('property_id').pluck('property_id');
	await db('jobs').whereIn('id', jobIds).delete();
	await db('properties')
		.whereIn('id', propertyIds)
		.whereNotExists(db('property_owners').whereRaw('property_owners.property_id = properties.id'))
		.whereNotExists(db('jobs').whereRaw('jobs.property_id = properties.id'))
		.delete();
}

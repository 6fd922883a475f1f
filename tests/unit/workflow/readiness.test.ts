import { describe, expect, test } from 'vitest';
import type { Finding } from '../../../src/lib/electrical';
import type { JobDocument } from '../../../src/lib/electrical/schema';
import { changesServiceOrFeeder, findingKeys, submissionAction } from '../../../src/lib/workflow/readiness';
import { exampleDocument } from '../../fixtures/documents';

/** The cottage example with every circuit set to one status, and optionally a subpanel fed from a circuit. */
function cottage(status: 'existing' | 'new', feeder?: 'existing' | 'new'): JobDocument {
	const doc = exampleDocument('quillmere-cottage');
	const circuits = doc.circuits.map((c) => ({ ...c, status }));
	if (!feeder) return { ...doc, circuits };
	const feed = {
		...circuits[0]!,
		id: 'c-feed',
		position: 41,
		poles: 2 as const,
		label: 'Feeder to shed',
		status: feeder,
	};
	return {
		...doc,
		circuits: [...circuits, feed],
		panels: [
			...doc.panels,
			{
				...doc.panels[0]!,
				id: 'p-shed',
				name: 'Shed subpanel',
				kind: 'sub',
				fedFromCircuitId: 'c-feed',
				mainBreakerA: null,
			},
		],
	};
}

describe('when a job needs a load calculation', () => {
	test.each([
		['only existing circuits', cottage('existing'), false, /no new or modified feeder/],
		['a new circuit with loads on the main panel', cottage('new'), true, /adds load to the service/],
		['a new feeder to a subpanel', cottage('existing', 'new'), true, /feeder to Shed subpanel/],
		[
			'an existing feeder and existing circuits',
			cottage('existing', 'existing'),
			false,
			/no new or modified/,
		],
	])('%s: needed %s', (_what, doc, needed, why) => {
		const answer = changesServiceOrFeeder(doc);
		expect(answer.needed).toBe(needed);
		expect(answer.why).toMatch(why);
	});
});

describe('the submission move of each status', () => {
	test.each([
		['draft', 'submit'],
		['withdrawn', 'submit'],
		['corrections', 'resubmit'],
		['submitted', null],
		['in-review', null],
		['approved', null],
		['closed', null],
	] as const)('%s: %s', (status, action) => {
		expect(submissionAction(status)).toBe(action);
	});
});

describe('finding keys', () => {
	const f = (code: string, id: string): Finding => ({
		severity: 'violation',
		code,
		message: 'm',
		rule: 'NEC 2023 240.4(D)',
		target: { kind: 'circuit', id },
	});

	test('name the code and target, and number repeats on one target', () => {
		expect(
			findingKeys([f('small-conductor', 'c1'), f('small-conductor', 'c2'), f('small-conductor', 'c1')]),
		).toEqual(['small-conductor:circuit:c1', 'small-conductor:circuit:c2', 'small-conductor:circuit:c1#2']);
	});
});

import { describe, expect, test } from 'vitest';
import { computeJob, parseJobDocument } from '../../../src/lib/electrical/index';
import type { JobDocumentInput, JobResult } from '../../../src/lib/electrical/index';
import { circuit, job, load } from './job-builder';

function run(input: JobDocumentInput): JobResult {
	const parsed = parseJobDocument(input);
	if (!parsed.ok) throw new Error(parsed.errors.join('\n'));
	return computeJob(parsed.doc);
}

type Edition = '2017' | '2020' | '2023';
type Options = { gfciEdition?: Edition | null; afciEdition?: Edition | null };

const rooms = [
	{ id: 'kit', name: 'Kitchen', type: 'kitchen' as const, areaFt2: 150 },
	{ id: 'base', name: 'Basement', type: 'basement' as const, areaFt2: 500 },
	{ id: 'bed', name: 'Bedroom', type: 'bedroom' as const, areaFt2: 150 },
	{ id: 'gar', name: 'Garage', type: 'garage' as const, areaFt2: 300 },
];

/** One circuit in one room with one load, in a job of `edition` with the given rule options. */
function one(
	edition: Edition,
	ruleOptions: Options | undefined,
	roomId: string,
	kind: 'receptacles' | 'lighting',
	over: Partial<Parameters<typeof circuit>[0]> = {},
): JobResult {
	return run(
		job({
			codeEdition: edition,
			...(ruleOptions ? { ruleOptions } : {}),
			rooms,
			circuits: [circuit({ id: 'c', position: 1, roomIds: [roomId], ...over })],
			loads: [
				load({ circuitId: 'c', kind, va: 180, roomIds: [roomId], voltage: over.poles === 2 ? 240 : 120 }),
			],
		}),
	);
}

const finding = (r: JobResult, code: string) =>
	r.findings.find((f) => f.target.id === 'c' && f.code === code);

describe('local amendments as engine rule options', () => {
	test('a 2023 job under the 2017 GFCI list needs no GFCI for kitchen receptacles away from the countertop', () => {
		// NFPA 70 (NEC) 2023, 210.8(A)(5): all kitchen receptacles; NFPA 70 (NEC) 2017, 210.8(A)(6): only
		// those serving countertop surfaces (list numbers from memory).
		const adopted = one('2023', undefined, 'kit', 'receptacles', { breakerType: 'afci' });
		expect(finding(adopted, 'gfci-required')?.severity).toBe('violation');
		const amended = one('2023', { gfciEdition: '2017' }, 'kit', 'receptacles', { breakerType: 'afci' });
		expect(finding(amended, 'gfci-required')).toBeUndefined();
	});

	test('a 2017 job under the 2020 GFCI list needs GFCI in every basement, not only an unfinished one', () => {
		// NFPA 70 (NEC) 2017, 210.8(A)(5): unfinished portions of basements; NFPA 70 (NEC) 2020, 210.8(A)(5): basements.
		expect(finding(one('2017', undefined, 'base', 'receptacles'), 'gfci-required')?.severity).toBe('warning');
		const amended = one('2017', { gfciEdition: '2020' }, 'base', 'receptacles');
		expect(finding(amended, 'gfci-required')).toMatchObject({
			severity: 'violation',
			rule: 'NEC 2020 210.8(A) (local amendment)',
		});
	});

	test('a 2023 job under the 2017 GFCI list leaves a 240 V garage receptacle circuit out of 210.8(A)', () => {
		// NFPA 70 (NEC) 2017, 210.8(A): 125 V, single-phase, 15 and 20 A receptacles; NFPA 70 (NEC) 2020 and
		// 2023, 210.8(A): 125 V through 250 V receptacles on single-phase branch circuits.
		const over = {
			poles: 2 as const,
			ratingA: 30 as const,
			conductor: { size: '10', material: 'cu', insulationC: 90 },
		};
		expect(
			finding(one('2023', undefined, 'gar', 'receptacles', over as never), 'gfci-required')?.severity,
		).toBe('violation');
		expect(
			finding(one('2023', { gfciEdition: '2017' }, 'gar', 'receptacles', over as never), 'gfci-required'),
		).toBe(undefined);
	});

	test('a 2020 job under the 2023 AFCI list needs AFCI on a 10 A bedroom circuit', () => {
		// NFPA 70 (NEC) 2020, 210.12(A): 15 and 20 A branch circuits; NFPA 70 (NEC) 2023, 210.12(B): 10, 15 and 20 A.
		const tenAmp = {
			ratingA: 10 as const,
			conductor: { size: '14' as const, material: 'cu' as const, insulationC: 90 as const },
		};
		expect(finding(one('2020', undefined, 'bed', 'lighting', tenAmp), 'afci-required')).toBeUndefined();
		expect(
			finding(one('2020', { afciEdition: '2023' }, 'bed', 'lighting', tenAmp), 'afci-required'),
		).toMatchObject({
			severity: 'violation',
			rule: 'NEC 2023 210.12(B) (local amendment)',
		});
	});

	test('an amended AFCI list is cited by its own edition on the protected circuit and in the device note', () => {
		// NFPA 70 (NEC) 2023, 210.12(B) is 210.12(A) in 2020: the amended finding cites the 2020 paragraph.
		const ok = one('2023', { afciEdition: '2020' }, 'bed', 'lighting', { breakerType: 'afci' });
		expect(JSON.parse(JSON.stringify(finding(ok, 'afci-required')))).toMatchObject({
			severity: 'ok',
			rule: 'NEC 2020 210.12(A) (local amendment)',
		});
		const device = one('2023', { afciEdition: '2020' }, 'bed', 'lighting', { afciAtDevice: true });
		expect(finding(device, 'afci-required')?.message).toContain('NEC 2020 210.12(A) (local amendment)');
	});

	test('options naming the job’s own edition give the same result as no options', () => {
		const plain = one('2023', undefined, 'kit', 'receptacles');
		const same = one('2023', { gfciEdition: '2023', afciEdition: '2023' }, 'kit', 'receptacles');
		expect(JSON.stringify(same)).toBe(JSON.stringify(plain));
		expect(finding(plain, 'gfci-required')?.rule).toBe('NEC 2023 210.8(A)');
	});

	test.each([
		[{ gfciEdition: '2014' }, 'ruleOptions.gfciEdition'],
		[{ afciEdition: 2020 }, 'ruleOptions.afciEdition'],
		[{ gfciEdition: null, extra: true }, 'ruleOptions'],
		['2017', 'ruleOptions'],
	])('rule options %j are refused with a message at %s', (ruleOptions, path) => {
		const parsed = parseJobDocument({ ...job(), ruleOptions } as unknown as JobDocumentInput);
		expect(parsed.ok).toBe(false);
		if (!parsed.ok) expect(parsed.errors.join('\n')).toContain(path);
	});
});

import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, test, vi } from 'vitest';
import { benchSketches, largeJob } from '../../../scripts/bench/large-job';
import { printable } from '../../../src/lib/documents/fonts';
import { renderPacket } from '../../../src/lib/documents/render-packet';
import type { DocumentData } from '../../../src/lib/documents/types';
import { layoutRecessedLights, type RecessedLayoutInput } from '../../../src/lib/electrical';
import { dataFor, exampleDocument } from '../../fixtures/documents';
import { readPdf, squash, type PdfPage } from '../../helpers/pdf';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'ampledger-packet-test-'));
const n2 = (v: number) => v.toLocaleString('en-US', { maximumFractionDigits: 2 });
let data: DocumentData;
let pages: PdfPage[];
let all: string;

const layoutInput: RecessedLayoutInput = {
	lengthFt: 16,
	widthFt: 12,
	ceilingHeightFt: 9,
	fixtureDiameterIn: 6,
	joists: { direction: 'along-width', spacingIn: 16, firstOffsetIn: 8 },
};

beforeAll(async () => {
	const layout = layoutRecessedLights(layoutInput);
	if (!layout.ok) throw new Error('layout failed');
	data = dataFor(largeJob(), {
		sketches: await benchSketches(dir, 2, 1, 3),
		layouts: [{ title: 'Recessed lights', roomName: 'Kitchen 1', input: layoutInput, layout: layout.layout }],
	});
	// Rendering must not reach the network (the layout engine reads its wasm from a data: URL, which is local).
	const realFetch = globalThis.fetch;
	const remote: string[] = [];
	const fetchSpy = vi.spyOn(globalThis, 'fetch').mockImplementation((input, init) => {
		const url = typeof input === 'string' ? input : input instanceof URL ? input.href : input.url;
		if (url.startsWith('data:')) return realFetch(input, init);
		remote.push(url);
		return Promise.reject(new Error('no network during rendering'));
	});
	pages = await readPdf(await renderPacket(data, 'letter'));
	fetchSpy.mockRestore();
	expect(remote).toEqual([]);
	all = squash(pages.map((p) => p.text).join(' '));
}, 60_000);

afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

describe('permit packet PDF', () => {
	test('numbers every page "Sheet N of M" with the job and revision', () => {
		expect(pages.length).toBeGreaterThan(15);
		pages.forEach((p, i) =>
			expect(p.text).toContain(`Sheet ${i + 1} of ${pages.length} · ${data.job.name} · rev ${data.revision}`),
		);
	});

	test('opens with a cover sheet naming the job, property, homeowner, firm and licence, AHJ, permit, scope, edition and date', () => {
		const cover = squash(pages[0]!.text);
		for (const s of [
			data.job.name,
			data.job.address,
			data.job.homeownerName,
			data.firm.name,
			`licence ${data.firm.licenceNumber}`,
			data.jurisdiction!.name,
			data.job.permitType,
			data.job.permitNumber,
			'NEC 2023',
			'December 2, 2026',
			'Sheet index',
		])
			expect(cover).toContain(s);
		expect(cover).toContain(squash(data.job.scopeOfWork).slice(0, 40));
	});

	test('its sheet index points at the right sheets', () => {
		const index = pages[0]!.items;
		const findSheet = (title: string) => {
			const row = index.find((t) => t.str.startsWith(title));
			const cell = row && index.find((t) => Math.abs(t.y - row.y) < 1 && t.x < row.x && /^\d/.test(t.str));
			return cell ? Number(cell.str.split('–')[0]) : null;
		};
		for (const [title, marker] of [
			['Load calculation worksheet', 'Dwelling service load'],
			['Circuit findings', 'Checks of every circuit'],
			['Cautions, limits and signature', 'Before work, and what this packet claims'],
			['Panel schedule: Sub A', 'Sub A — Basement stair'],
		]) {
			const sheet = findSheet(title!);
			expect(sheet, title).not.toBeNull();
			expect(squash(pages[sheet! - 1]!.text)).toContain(marker!);
		}
	});

	test('shows every step of the load calculation with the engine’s figures and code references', () => {
		const methods = data.result.service.methods.filter((m) => m.applicable);
		expect(methods.map((m) => m.method)).toEqual(expect.arrayContaining(['standard', 'optional']));
		for (const m of methods) {
			expect(all).toContain(m.title);
			for (const l of m.lines) {
				expect(all).toContain(squash(printable(l.working)));
				expect(all).toContain(l.rule);
			}
			expect(all).toContain(`${n2(m.totalVA!.value)} VA`);
			expect(all).toContain(`${n2(m.ampsRounded!.value)} A`);
			expect(all).toContain(squash(printable(m.minimumServiceA!.working)));
		}
		for (const m of data.result.service.methods.filter((x) => !x.applicable))
			expect(all).toContain(squash(`Not applicable: ${m.reason}`));
	});

	test('holds every panel’s schedule and every circuit’s label and rating', () => {
		for (const p of data.doc.panels) expect(all).toContain(`${p.name} — ${p.location}`);
		for (const c of data.doc.circuits) {
			expect(all).toContain(c.label === 'Spare' ? 'SPARE' : squash(c.label));
			expect(all).toContain(`${c.ratingA} A ${c.poles}P`);
		}
	});

	test('lists the findings of the circuits', () => {
		const bad = data.result.circuits.flatMap((c) => c.findings).filter((f) => f.severity === 'violation');
		expect(bad.length).toBeGreaterThan(0);
		for (const f of bad.slice(0, 10)) expect(all).toContain(squash(printable(f.message)).slice(0, 50));
	});

	test('draws the lighting layout to a stated scale', () => {
		const sheet = pages.find(
			(p) =>
				p.text.includes('Lighting layout, drawn to scale'.toUpperCase()) ||
				p.text.includes('Recessed lights — Kitchen 1'),
		);
		expect(sheet).toBeDefined();
		expect(sheet!.text).toContain('3/8 in = 1 ft');
	});

	test('places image sketches with their captions and merges PDF sketches page by page', () => {
		const captions = pages
			.slice(1)
			.filter((p) => /Sketch \d of 3: Floor plan \d, circuits marked/.test(p.text));
		expect(captions).toHaveLength(2);
		for (let k = 1; k <= 3; k++) {
			const page = pages.find((p) => p.text.includes(`Drawing set 1, page ${k}`));
			expect(page, `merged page ${k}`).toBeDefined();
			expect(page!.text).toContain(`Sketch: Electrical drawings set 1, page ${k} of 3`);
		}
	});

	test('ends with the cautions, the limits of what it claims, and a signature and date block', () => {
		const last = squash(pages[pages.length - 1]!.text);
		expect(last).toContain('Switch the breaker off and verify with a tester');
		expect(last).toContain('licensed electricians');
		expect(last).toContain('does not certify a design');
		expect(last).toContain('Signature of the licensed electrician');
		expect(last).toContain('Date');
	});

	test('a sketch whose file is missing becomes a page saying so instead of failing the packet', async () => {
		const cottage = dataFor(exampleDocument('quillmere-cottage'), {
			sketches: [
				{
					id: 'gone',
					caption: 'Basement plan',
					originalName: 'basement.png',
					contentType: 'image/png',
					path: path.join(dir, 'nope.png'),
					roomName: null,
				},
			],
		});
		const text = (await readPdf(await renderPacket(cottage))).map((p) => p.text).join(' ');
		expect(text).toContain('Sketch 1 of 1: Basement plan');
		expect(text).toContain('The file is missing from storage.');
	});
});

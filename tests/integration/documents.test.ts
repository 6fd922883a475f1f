import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { DEMO_PROPERTIES } from '../../seeds/data/demo-accounts';
import { testDb } from '../helpers/db';
import { HttpClient, signedInAs } from '../helpers/http';
import { decodeQr, pdfToPngs, readPdf, squash } from '../helpers/pdf';

const db = testDb();
let owner: HttpClient;
let homeowner: HttpClient;
let otherHomeowner: HttpClient;
let inspector: HttpClient;
let otherFirm: HttpClient;
let otherFirmIds: { firmId: string; userId: string } | undefined;
let jobId: string;
let panelId: string;
let panelIds: string[];

const example = JSON.parse(fs.readFileSync(path.resolve('examples/quillmere-cottage.json'), 'utf8'));
const endpoints = () => [
	['panel schedule', `/api/jobs/${jobId}/documents/panel-schedule/${panelId}.pdf`],
	['directory card', `/api/jobs/${jobId}/documents/directory-card/${panelId}.pdf`],
	['packet', `/api/jobs/${jobId}/documents/packet.pdf`],
];

async function pdfOf(client: HttpClient, url: string): Promise<Uint8Array> {
	const res = await client.fetch(url);
	expect(res.status, url).toBe(200);
	expect(res.headers.get('content-type')).toBe('application/pdf');
	return new Uint8Array(await res.arrayBuffer());
}

beforeAll(async () => {
	[owner, homeowner, otherHomeowner, inspector] = await Promise.all([
		signedInAs('owner'),
		signedInAs('homeowner'),
		signedInAs('homeowner2'),
		signedInAs('inspector'),
	]);
	const imported = await owner.json<{ job: { id: string } }>('/api/jobs/import', {
		method: 'POST',
		body: { ...example, name: 'Documents test: cottage remodel', address: DEMO_PROPERTIES.penhallow },
	});
	expect(imported.status).toBe(201);
	jobId = imported.body.job.id;
	panelIds = (await db('panels').where({ job_id: jobId }).orderBy('kind').pluck('id')) as string[];
	panelId = (await db('panels').where({ job_id: jobId, kind: 'main' }).first('id')).id;

	const email = `documents-other-${Date.now()}@fallowmere.example`;
	const signUp = await new HttpClient().json<{ firmId: string; userId: string }>('/api/sign-up', {
		method: 'POST',
		body: {
			firmName: 'Fallowmere Wiring Co.',
			licenceNumber: 'EC-7730',
			name: 'Idris Pennock',
			email,
			password: 'correct-horse-battery',
			confirmPassword: 'correct-horse-battery',
		},
	});
	expect(signUp.status).toBe(201);
	otherFirmIds = signUp.body;
	otherFirm = new HttpClient();
	expect(await otherFirm.signIn(email, 'correct-horse-battery')).toBeNull();
}, 60_000);

afterAll(async () => {
	if (jobId) await db('jobs').where({ id: jobId }).delete();
	if (otherFirmIds) {
		await db('firms').where({ id: otherFirmIds.firmId }).delete();
		await db('users').where({ id: otherFirmIds.userId }).delete();
	}
	await db.destroy();
});

describe('who may fetch the documents', () => {
	test.each([0, 1, 2])('signed out, endpoint %i answers 401', async (i) => {
		const res = await new HttpClient().fetch(endpoints()[i]![1]!);
		expect(res.status).toBe(401);
	});

	test.each([
		['another firm', () => otherFirm],
		['an inspector', () => inspector],
		['the owner of another home', () => otherHomeowner],
	])('%s gets 404 from every endpoint', async (_who, client) => {
		for (const [, url] of endpoints()) expect((await client().fetch(url!)).status, url).toBe(404);
	});

	test('the firm’s people get every document', async () => {
		for (const [name, url] of endpoints()) {
			const bytes = await pdfOf(owner, url!);
			expect((await readPdf(bytes)).length, name).toBeGreaterThan(0);
		}
	});

	test('the homeowner gets the schedule and card of their home, and no packet before one is submitted', async () => {
		const [schedule, card, packet] = endpoints();
		await pdfOf(homeowner, schedule![1]!);
		await pdfOf(homeowner, card![1]!);
		// Readers other than the firm get the latest submitted revision's packet (tests/integration/submission.test.ts).
		expect((await homeowner.fetch(packet![1]!)).status).toBe(404);
	});

	test('a panel of another job, or no such panel, is 404', async () => {
		const res = await owner.fetch(
			`/api/jobs/${jobId}/documents/panel-schedule/00000000-0000-4000-8000-000000000000.pdf`,
		);
		expect(res.status).toBe(404);
	});

	test.each([
		['a4', 842, 595],
		['letter', 792, 612],
	])('?size=%s prints the schedule on that paper', async (size, w, h) => {
		const pages = await readPdf(
			await pdfOf(owner, `/api/jobs/${jobId}/documents/panel-schedule/${panelId}.pdf?size=${size}`),
		);
		expect(pages[0]!.width).toBeCloseTo(w, 0);
		expect(pages[0]!.height).toBeCloseTo(h, 0);
	});

	test('an unknown paper size is a 400 naming the field', async () => {
		const res = await owner.json<{ error: { code: string; fields: Record<string, string[]> } }>(
			`/api/jobs/${jobId}/documents/panel-schedule/${panelId}.pdf?size=b5`,
		);
		expect(res.status).toBe(400);
		expect(res.body.error.fields.size).toBeDefined();
	});

	test('?download=1 asks the browser to save the file', async () => {
		const res = await owner.fetch(`/api/jobs/${jobId}/documents/packet.pdf?download=1`);
		expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="permit-packet-/);
	});
});

describe('the permit packet from the database', () => {
	test('carries the job, firm licence, jurisdiction, every circuit label and sheet numbers', async () => {
		const pages = await readPdf(await pdfOf(owner, `/api/jobs/${jobId}/documents/packet.pdf`));
		const text = squash(pages.map((p) => p.text).join(' '));
		expect(text).toContain('Documents test: cottage remodel');
		expect(text).toContain('licence EC-40917');
		for (const c of example.circuits as { label: string }[]) expect(text).toContain(squash(c.label));
		pages.forEach((p, i) =>
			expect(p.text).toContain(
				`Sheet ${i + 1} of ${pages.length} · Documents test: cottage remodel · rev 1 draft (not submitted)`,
			),
		);
	});

	test('does not hold up other requests while it renders', async () => {
		const packet = owner.fetch(`/api/jobs/${jobId}/documents/packet.pdf`);
		await new Promise((r) => setTimeout(r, 150));
		const started = performance.now();
		const health = await new HttpClient().fetch('/api/health');
		const waited = performance.now() - started;
		expect(health.status).toBe(200);
		expect(waited).toBeLessThan(400);
		expect((await packet).status).toBe(200);
	});
});

describe('the panel map link', () => {
	let link: string;

	test('the directory card’s QR code carries the map link, which opens the map without signing in', async () => {
		const bytes = await pdfOf(owner, `/api/jobs/${jobId}/documents/directory-card/${panelId}.pdf`);
		const [png] = pdfToPngs(bytes, 150, 1, 1);
		link = (await decodeQr(png!))!;
		expect(link).toMatch(/\/map\/[A-Za-z0-9_-]{32}$/);
		const shown = await owner.json<{ link: string }>(`/api/jobs/${jobId}/map-token`);
		expect(shown.body.link).toBe(link);
		const page = await new HttpClient().fetch(new URL(link).pathname);
		expect(page.status).toBe(200);
		const html = await page.text();
		expect(html).toContain('Dishwasher');
		expect(html).toContain('Switch the breaker off and verify with a tester before any work.');
	});

	test('the token is stored only as a hash', async () => {
		const token = link.split('/map/')[1]!;
		const rows = await db('panel_map_tokens').where({ job_id: jobId });
		expect(rows).toHaveLength(1);
		expect(JSON.stringify(rows)).not.toContain(token);
	});

	test('the homeowner’s card shows the same link, and a homeowner cannot change it', async () => {
		const bytes = await pdfOf(homeowner, `/api/jobs/${jobId}/documents/directory-card/${panelId}.pdf`);
		const [png] = pdfToPngs(bytes, 150, 1, 1);
		expect(await decodeQr(png!)).toBe(link);
		expect((await homeowner.fetch(`/api/jobs/${jobId}/map-token`, { method: 'DELETE' })).status).toBe(403);
		expect((await homeowner.fetch(`/api/jobs/${jobId}/map-token`, { method: 'POST' })).status).toBe(403);
		expect((await otherFirm.fetch(`/api/jobs/${jobId}/map-token`, { method: 'DELETE' })).status).toBe(404);
		expect((await new HttpClient().fetch(new URL(link).pathname)).status).toBe(200);
	});

	test('a revoked link stops working: map, card and sketches answer 404', async () => {
		const path = new URL(link).pathname;
		const revoked = await owner.json<{ revoked: number }>(`/api/jobs/${jobId}/map-token`, {
			method: 'DELETE',
		});
		expect(revoked.body.revoked).toBe(1);
		for (const p of [path, `${path}/card`, `${path}/sketches/00000000-0000-4000-8000-000000000000`]) {
			const res = await new HttpClient().fetch(p);
			expect(res.status, p).toBe(404);
			expect(await res.text()).not.toContain('Dishwasher');
		}
		expect((await owner.json<{ link: string | null }>(`/api/jobs/${jobId}/map-token`)).body.link).toBeNull();
	});

	test('reissuing gives a new working link and the old one stays dead', async () => {
		const res = await owner.json<{ link: string }>(`/api/jobs/${jobId}/map-token`, { method: 'POST' });
		expect(res.status).toBe(201);
		expect(res.body.link).not.toBe(link);
		expect((await new HttpClient().fetch(new URL(res.body.link).pathname)).status).toBe(200);
		expect((await new HttpClient().fetch(new URL(res.body.link).pathname + '/card')).status).toBe(200);
		expect((await new HttpClient().fetch(new URL(link).pathname)).status).toBe(404);
	});

	test.each([['not-a-token'], ['AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA']])(
		'an unknown token %s is 404',
		async (token) => {
			expect((await new HttpClient().fetch(`/map/${token}`)).status).toBe(404);
		},
	);

	test('the signed-in homeowner sees the map of their home without a token; others do not', async () => {
		const property = (await db('jobs').where({ id: jobId }).first('property_id')).property_id as string;
		const mine = await homeowner.fetch(`/homeowner/homes/${property}?job=${jobId}`);
		expect(mine.status).toBe(200);
		expect(await mine.text()).toContain('Dishwasher');
		expect((await otherHomeowner.fetch(`/homeowner/homes/${property}`)).status).toBe(404);
		expect((await homeowner.fetch(`/homeowner/homes/${property}/card?job=${jobId}`)).status).toBe(200);
		const start = await (await homeowner.fetch('/homeowner')).text();
		expect(start).toContain(`/homeowner/homes/${property}`);
	});

	test('every panel of the job has a schedule', async () => {
		for (const id of panelIds) await pdfOf(owner, `/api/jobs/${jobId}/documents/panel-schedule/${id}.pdf`);
	});
});

describe('lighting layouts kept for the packet', () => {
	const good = {
		title: 'Kitchen recessed lights',
		roomId: null,
		input: {
			lengthFt: 16,
			widthFt: 12,
			ceilingHeightFt: 9,
			fixtureDiameterIn: 6,
			joists: { direction: 'along-width', spacingIn: 16, firstOffsetIn: 8 },
		},
	};

	test.each([
		['an empty name', { ...good, title: '  ' }, 'title'],
		['a negative length', { ...good, input: { ...good.input, lengthFt: -4 } }, 'input.lengthFt'],
		['a room of no job', { ...good, roomId: '00000000-0000-4000-8000-000000000000' }, 'roomIds.0'],
	])('%s is refused with a message on the field, and nothing is written', async (_what, body, field) => {
		const res = await owner.json<{ error: { fields: Record<string, string[]> } }>(
			`/api/jobs/${jobId}/lighting-layouts`,
			{ method: 'POST', body },
		);
		expect(res.status).toBe(400);
		expect(res.body.error.fields[field]).toBeDefined();
		expect(await db('lighting_layouts').where({ job_id: jobId }).count({ n: '*' })).toEqual([{ n: '0' }]);
	});

	test('the homeowner may not add one', async () => {
		expect(
			(await homeowner.json(`/api/jobs/${jobId}/lighting-layouts`, { method: 'POST', body: good })).status,
		).toBe(403);
	});

	test('a saved layout is drawn to scale in the packet, and removing it takes it out', async () => {
		const kitchen = (await db('rooms').where({ job_id: jobId, name: 'Kitchen' }).first('id')).id as string;
		const saved = await owner.json<{ layout: { id: string } }>(`/api/jobs/${jobId}/lighting-layouts`, {
			method: 'POST',
			body: { ...good, roomId: kitchen },
		});
		expect(saved.status).toBe(201);
		let text = squash(
			(await readPdf(await pdfOf(owner, `/api/jobs/${jobId}/documents/packet.pdf`)))
				.map((p) => p.text)
				.join(' '),
		);
		expect(text).toContain('Lighting layout: Kitchen recessed lights (Kitchen)');
		expect(text).toContain('3/8 in = 1 ft');
		expect(
			(await homeowner.json(`/api/lighting-layouts/${saved.body.layout.id}`, { method: 'DELETE' })).status,
		).toBe(403);
		expect(
			(await otherFirm.json(`/api/lighting-layouts/${saved.body.layout.id}`, { method: 'DELETE' })).status,
		).toBe(404);
		expect(
			(await owner.json(`/api/lighting-layouts/${saved.body.layout.id}`, { method: 'DELETE' })).status,
		).toBe(200);
		text = squash(
			(await readPdf(await pdfOf(owner, `/api/jobs/${jobId}/documents/packet.pdf`)))
				.map((p) => p.text)
				.join(' '),
		);
		expect(text).not.toContain('Kitchen recessed lights');
	});
});

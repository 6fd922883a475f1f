import { createHash, randomUUID } from 'node:crypto';
import fs from 'node:fs';
import { crc32 } from 'node:zlib';
import path from 'node:path';
import { PDFDocument, StandardFonts } from 'pdf-lib';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { DEMO_FIRM, DEMO_PROPERTIES } from '../../seeds/data/demo-accounts';
import { DEMO_JOB_DOCUMENT } from '../../seeds/data/demo-job';
import { testDb } from '../helpers/db';
import { BASE_URL, HttpClient, signedInAs } from '../helpers/http';

const db = testDb();
const uploads = process.env.UPLOADS_DIR!;
const incoming = path.join(uploads, '.incoming');
const MB = 1024 * 1024;

type ErrorBody = {
	error: { code: string; message: string; fields?: Record<string, string[]>; current?: { version: number } };
};
interface SketchJson {
	id: string;
	jobId: string;
	roomId: string | null;
	caption: string;
	originalName: string;
	contentType: string;
	size: number;
	sha256: string;
	width: number | null;
	height: number | null;
	pageCount: number | null;
	version: number;
	urls: { file: string; thumbnail: string | null };
}
interface Upload {
	name: string;
	type: string;
	bytes: Uint8Array;
}

let owner: HttpClient;
let homeowner: HttpClient;
let otherHomeowner: HttpClient;
let otherFirm: HttpClient;
let otherFirmIds: { firmId: string; userId: string };
let jobId: string;
let roomId: string;
let png: Buffer;
let jpeg: Buffer;
let pdf: Uint8Array;

const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');
const list = (dir: string) => (fs.existsSync(dir) ? fs.readdirSync(dir).sort() : []);

/** A drawing with some lines on it, so that it compresses like a real plan rather than a flat colour. */
async function drawing(format: 'png' | 'jpeg', width: number, height: number): Promise<Buffer> {
	const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}">
		<rect width="100%" height="100%" fill="#fff"/>
		<rect x="40" y="40" width="${width - 80}" height="${height - 80}" fill="none" stroke="#222" stroke-width="8"/>
		<line x1="${width / 2}" y1="40" x2="${width / 2}" y2="${height - 40}" stroke="#222" stroke-width="4"/>
		<text x="80" y="120" font-size="40" font-family="sans-serif">Kitchen</text>
	</svg>`;
	const img = sharp(Buffer.from(svg));
	return format === 'png' ? img.png().toBuffer() : img.jpeg({ quality: 85 }).toBuffer();
}

async function twoPagePdf(): Promise<Uint8Array> {
	const doc = await PDFDocument.create();
	const font = await doc.embedFont(StandardFonts.Helvetica);
	for (const title of ['First floor', 'Basement']) {
		const page = doc.addPage([792, 612]);
		page.drawRectangle({ x: 50, y: 50, width: 692, height: 512, borderWidth: 3 });
		page.drawText(title, { x: 70, y: 530, size: 24, font });
	}
	return doc.save();
}

function form(files: Upload[], fields: Record<string, string> = {}): FormData {
	const body = new FormData();
	for (const [k, v] of Object.entries(fields)) body.append(k, v);
	for (const f of files)
		body.append('files', new Blob([f.bytes as Uint8Array<ArrayBuffer>], { type: f.type }), f.name);
	return body;
}

async function upload(client: HttpClient, files: Upload[], fields: Record<string, string> = {}, job = jobId) {
	const res = await client.fetch(`/api/jobs/${job}/sketches`, { method: 'POST', body: form(files, fields) });
	return { status: res.status, body: (await res.json()) as { sketches: SketchJson[] } & ErrorBody };
}

/** Everything an upload could leave behind: rows, audit rows, files beside the job, files waiting in the incoming folder. */
async function traces() {
	return {
		rows: (await db('sketches').where({ job_id: jobId }).orderBy('id').pluck('id')) as string[],
		audit: Number((await db('audit_log').where({ job_id: jobId, entity: 'sketch' }).count('* as n'))[0]!.n),
		jobFiles: list(path.join(uploads, jobId)),
		incoming: list(incoming),
		uploadsRoot: list(uploads),
	};
}

async function removeAllSketches() {
	await db('sketches').where({ job_id: jobId }).delete();
	await db('audit_log').where({ job_id: jobId, entity: 'sketch' }).delete();
	fs.rmSync(path.join(uploads, jobId), { recursive: true, force: true });
}

beforeAll(async () => {
	const firm = await db('firms').where({ name: DEMO_FIRM.name }).first('id');
	const property = await db('properties').where({ address: DEMO_PROPERTIES.penhallow }).first('id');
	[{ id: jobId }] = await db('jobs')
		.insert({
			firm_id: firm.id,
			property_id: property.id,
			name: 'Sketch upload test job',
			address: DEMO_PROPERTIES.penhallow,
			code_edition: '2023',
			service_rating_a: 200,
			voltage_system: '120/240-1ph-3w',
		})
		.returning('id');
	[{ id: roomId }] = await db('rooms')
		.insert({ job_id: jobId, name: 'Kitchen', type: 'kitchen' })
		.returning('id');

	const email = `sketch-other-${Date.now()}@harrowgate.example`;
	const signUp = await new HttpClient().json<{ firmId: string; userId: string }>('/api/sign-up', {
		method: 'POST',
		body: JSON.stringify({
			firmName: 'Harrowgate Lane Electric',
			licenceNumber: 'EC-5521',
			name: 'Perrin Ockley',
			email,
			password: 'correct-horse-battery',
			confirmPassword: 'correct-horse-battery',
		}),
	});
	expect(signUp.status).toBe(201);
	otherFirmIds = signUp.body;
	otherFirm = new HttpClient();
	expect(await otherFirm.signIn(email, 'correct-horse-battery')).toBeNull();

	[owner, homeowner, otherHomeowner] = await Promise.all([
		signedInAs('owner'),
		signedInAs('homeowner'),
		signedInAs('homeowner2'),
	]);
	[png, jpeg, pdf] = await Promise.all([
		drawing('png', 1200, 800),
		drawing('jpeg', 1600, 1000),
		twoPagePdf(),
	]);
});

afterAll(async () => {
	if (jobId) {
		await db('jobs').where({ id: jobId }).delete();
		fs.rmSync(path.join(uploads, jobId), { recursive: true, force: true });
	}
	if (otherFirmIds) {
		await db('firms').where({ id: otherFirmIds.firmId }).delete();
		await db('users').where({ id: otherFirmIds.userId }).delete();
	}
	await db.destroy();
});

describe('uploading sketches', () => {
	test.each([
		[
			'a PNG',
			() => ({ name: 'ground-floor.png', type: 'image/png', bytes: png }),
			'image/png',
			{ width: 1200, height: 800, pageCount: null },
		],
		[
			'a JPEG',
			() => ({ name: 'garage photo.jpg', type: 'image/jpeg', bytes: jpeg }),
			'image/jpeg',
			{ width: 1600, height: 1000, pageCount: null },
		],
		[
			'a PDF',
			() => ({ name: 'plans.pdf', type: 'application/pdf', bytes: pdf }),
			'application/pdf',
			{ width: null, height: null, pageCount: 2 },
		],
	])(
		'%s is stored with its size and checksum and served back byte for byte',
		async (_label, make, type, dims) => {
			const file = make();
			const res = await upload(owner, [file], { caption: 'Ground floor as found', roomId });
			expect(res.status).toBe(201);
			try {
				const [sketch] = res.body.sketches;
				expect(sketch).toMatchObject({
					jobId,
					roomId,
					caption: 'Ground floor as found',
					originalName: file.name,
					contentType: type,
					size: file.bytes.byteLength,
					sha256: sha256(file.bytes),
					...dims,
				});
				const row = await db('sketches').where({ id: sketch!.id }).first();
				expect(row).toMatchObject({
					size_bytes: file.bytes.byteLength,
					sha256: sha256(file.bytes),
					content_type: type,
					uploaded_by: expect.any(String),
				});
				expect(row.stored_name).toMatch(/^[0-9a-f-]{36}\.(png|jpg|pdf)$/);
				expect(
					fs.readFileSync(path.join(uploads, jobId, row.stored_name)).equals(Buffer.from(file.bytes)),
				).toBe(true);
				expect(
					await db('audit_log')
						.where({ entity: 'sketch', entity_id: sketch!.id, action: 'create' })
						.count('* as n'),
				).toEqual([{ n: '1' }]);

				const served = await owner.fetch(sketch!.urls.file);
				expect(served.status).toBe(200);
				expect(served.headers.get('content-type')).toBe(type);
				expect(served.headers.get('x-content-type-options')).toBe('nosniff');
				expect(served.headers.get('content-disposition')).toMatch(/^inline; filename="/);
				expect(Buffer.from(await served.arrayBuffer()).equals(Buffer.from(file.bytes))).toBe(true);

				const listed = await owner.json<{ sketches: SketchJson[] }>(`/api/jobs/${jobId}/sketches`);
				expect(listed.body.sketches.map((s) => s.id)).toEqual([sketch!.id]);

				if (type === 'application/pdf') {
					expect(sketch!.urls.thumbnail).toBeNull();
					expect((await owner.fetch(`/api/sketches/${sketch!.id}/thumbnail`)).status).toBe(404);
				} else {
					const thumb = await owner.fetch(sketch!.urls.thumbnail!);
					expect(thumb.status).toBe(200);
					expect(thumb.headers.get('content-type')).toBe('image/png');
					const meta = await sharp(Buffer.from(await thumb.arrayBuffer())).metadata();
					expect(meta).toMatchObject({ format: 'png', width: 480 });
				}
			} finally {
				await removeAllSketches();
			}
		},
	);

	test('several files in one request become one sketch each, with the same caption and room', async () => {
		const res = await upload(
			owner,
			[
				{ name: 'a.png', type: 'image/png', bytes: png },
				{ name: 'b.jpg', type: 'image/jpeg', bytes: jpeg },
				{ name: 'c.pdf', type: 'application/pdf', bytes: pdf },
			],
			{ caption: 'Set of three' },
		);
		try {
			expect(res.status).toBe(201);
			expect(res.body.sketches.map((s) => [s.originalName, s.caption, s.roomId])).toEqual([
				['a.png', 'Set of three', null],
				['b.jpg', 'Set of three', null],
				['c.pdf', 'Set of three', null],
			]);
			// Three files and two thumbnails beside the job, nothing left waiting.
			const after = await traces();
			expect(after.jobFiles).toHaveLength(5);
			expect(after.incoming).toEqual([]);
			expect(after.audit).toBe(3);
		} finally {
			await removeAllSketches();
		}
	});

	test('a file named with ../ is stored under a random name inside the job folder and nowhere else', async () => {
		const before = await traces();
		const res = await upload(owner, [{ name: '../../../escape.png', type: 'image/png', bytes: png }]);
		try {
			expect(res.status).toBe(201);
			const [sketch] = res.body.sketches;
			const row = await db('sketches').where({ id: sketch!.id }).first();
			expect(row.original_name).not.toContain('/');
			expect(row.stored_name).toMatch(/^[0-9a-f-]{36}\.png$/);
			const after = await traces();
			expect(after.uploadsRoot).toEqual([...new Set([...before.uploadsRoot, jobId])].sort());
			expect(after.jobFiles).toEqual([row.stored_name, `${row.stored_name}.thumb.png`].sort());
			expect(fs.existsSync(path.resolve(uploads, jobId, '../../../escape.png'))).toBe(false);
			expect(fs.existsSync(path.resolve(uploads, '..', 'escape.png'))).toBe(false);
		} finally {
			await removeAllSketches();
		}
	});

	const text = Buffer.from('Kitchen: 20 A small-appliance circuits x2\n');
	const svg = Buffer.from(
		'<?xml version="1.0"?><svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><script>alert(1)</script></svg>',
	);
	const pngHeaderThenJunk = () => Buffer.concat([png.subarray(0, 16), Buffer.alloc(4000, 7)]);
	// A real PNG whose header claims 12000 × 9000 pixels: small on disk, over 100 megapixels decoded.
	const hugeBitmap = () => {
		const head = Buffer.from(png);
		head.writeUInt32BE(12000, 16);
		head.writeUInt32BE(9000, 20);
		head.writeUInt32BE(crc32(head.subarray(12, 29)), 29);
		return head;
	};
	const oversized = () => {
		const big = Buffer.alloc(21 * MB, 0);
		png.copy(big);
		return big;
	};
	test.each([
		[
			'a text file named plan.png',
			() => [{ name: 'plan.png', type: 'image/png', bytes: text }],
			{},
			415,
			/“plan\.png” is not a PNG, JPEG or PDF file/,
		],
		[
			'an SVG drawing',
			() => [{ name: 'plan.svg', type: 'image/svg+xml', bytes: svg }],
			{},
			415,
			/“plan\.svg” is an SVG drawing/,
		],
		[
			'a PNG signature followed by junk',
			() => [{ name: 'broken.png', type: 'image/png', bytes: pngHeaderThenJunk() }],
			{},
			415,
			/could not be read as an image/,
		],
		[
			'an image of more than 100 megapixels',
			() => [{ name: 'scan.png', type: 'image/png', bytes: hugeBitmap() }],
			{},
			400,
			/“scan\.png” is 12000 × 9000 pixels; sketches may be at most 100 megapixels/,
		],
		[
			'a file larger than 20 MB',
			() => [{ name: 'huge-scan.png', type: 'image/png', bytes: oversized() }],
			{},
			413,
			/“huge-scan\.png” is larger than 20 MB/,
		],
		[
			'an empty file',
			() => [{ name: 'empty.pdf', type: 'application/pdf', bytes: new Uint8Array() }],
			{},
			400,
			/“empty\.pdf” is empty/,
		],
		[
			'eleven files at once',
			() => Array.from({ length: 11 }, (_, i) => ({ name: `p${i}.png`, type: 'image/png', bytes: png })),
			{},
			400,
			/at most 10 files/,
		],
		['no file at all', () => [], { caption: 'nothing' }, 400, /Choose at least one/],
		[
			'a good PNG beside a text file (all or nothing)',
			() => [
				{ name: 'good.png', type: 'image/png', bytes: png },
				{ name: 'notes.pdf', type: 'application/pdf', bytes: text },
			],
			{},
			415,
			/“notes\.pdf” is not a PNG/,
		],
		[
			'a caption over 200 characters',
			() => [{ name: 'a.png', type: 'image/png', bytes: png }],
			{ caption: 'c'.repeat(201) },
			400,
			/Some fields need attention/,
		],
		[
			'a room of no job of this firm',
			() => [{ name: 'a.png', type: 'image/png', bytes: png }],
			{ roomId: randomUUID() },
			400,
			/not part of this job/,
		],
	])(
		'%s is refused with its reason and leaves nothing behind',
		async (_label, files, fields, status, message) => {
			const before = await traces();
			const res = await upload(owner, files() as Upload[], fields as Record<string, string>);
			expect(res.status).toBe(status);
			expect(res.body.error.message).toMatch(message);
			expect(await traces()).toEqual(before);
		},
	);

	test('a job holds at most 40 sketches, and an upload past that is refused whole', async () => {
		// 39 rows stand in for earlier uploads (the limit counts rows, not files).
		await db('sketches').insert(
			Array.from({ length: 39 }, () => ({
				job_id: jobId,
				original_name: 'earlier.pdf',
				stored_name: `${randomUUID()}.pdf`,
				content_type: 'application/pdf',
				size_bytes: 1000,
				sha256: 'a'.repeat(64),
				page_count: 1,
			})),
		);
		try {
			const before = await traces();
			const res = await upload(owner, [
				{ name: 'a.png', type: 'image/png', bytes: png },
				{ name: 'b.png', type: 'image/png', bytes: png },
			]);
			expect(res.status).toBe(400);
			expect(res.body.error.message).toMatch(/only 1 more sketch \(at most 40 a job\)/);
			expect(await traces()).toEqual(before);

			expect((await upload(owner, [{ name: 'last.png', type: 'image/png', bytes: png }])).status).toBe(201);
			const full = await upload(owner, [{ name: 'one-too-many.png', type: 'image/png', bytes: png }]);
			expect(full.status).toBe(400);
			expect(full.body.error.message).toMatch(/already has 40 sketches/);
		} finally {
			await removeAllSketches();
		}
	});
});

describe('who may upload and see sketches', () => {
	const one = (): Upload[] => [{ name: 'plan.png', type: 'image/png', bytes: png }];

	test.each([
		['someone signed out', () => new HttpClient(), 401, 'unauthenticated'],
		['a contractor of another firm', () => otherFirm, 404, 'not_found'],
		['the homeowner of the house', () => homeowner, 403, 'forbidden'],
	])('%s may not upload', async (_label, who, status, code) => {
		const before = await traces();
		const res = await upload(who(), one());
		expect(res.status).toBe(status);
		expect(res.body.error.code).toBe(code);
		expect(await traces()).toEqual(before);
	});

	test.each([
		['with another site as Origin', { origin: 'http://elsewhere.example' }],
		['without an Origin header', {}],
	])('an upload sent %s is refused as cross-site', async (_label, headers) => {
		const before = await traces();
		const res = await fetch(`${BASE_URL}/api/jobs/${jobId}/sketches`, {
			method: 'POST',
			headers,
			body: form(one()),
		});
		expect(res.status).toBe(403);
		expect(((await res.json()) as ErrorBody).error.message).toMatch(/only from this site/);
		expect(await traces()).toEqual(before);
	});

	test('the homeowner reads their home’s sketches; another homeowner and another firm get 404', async () => {
		const res = await upload(owner, one());
		expect(res.status).toBe(201);
		const sketch = res.body.sketches[0]!;
		try {
			const listed = await homeowner.json<{ sketches: SketchJson[] }>(`/api/jobs/${jobId}/sketches`);
			expect(listed.status).toBe(200);
			expect(listed.body.sketches.map((s) => s.id)).toEqual([sketch.id]);
			const file = await homeowner.fetch(sketch.urls.file);
			expect(file.status).toBe(200);
			expect(Buffer.from(await file.arrayBuffer()).equals(png)).toBe(true);

			for (const outsider of [otherHomeowner, otherFirm]) {
				expect((await outsider.fetch(sketch.urls.file)).status).toBe(404);
				expect((await outsider.fetch(sketch.urls.thumbnail!)).status).toBe(404);
				expect((await outsider.json(`/api/jobs/${jobId}/sketches`)).status).toBe(404);
				expect((await outsider.json(`/api/sketches/${sketch.id}`, { method: 'DELETE' })).status).toBe(404);
			}
			expect((await new HttpClient().fetch(sketch.urls.file)).status).toBe(401);
			expect((await homeowner.json(`/api/sketches/${sketch.id}`, { method: 'DELETE' })).status).toBe(403);
			expect(await db('sketches').where({ id: sketch.id }).first('id')).toBeTruthy();
		} finally {
			await removeAllSketches();
		}
	});
});

describe('changing and deleting sketches', () => {
	test('a caption edit from a stale version is refused with 409 and the current sketch', async () => {
		const { body } = await upload(owner, [{ name: 'plan.png', type: 'image/png', bytes: png }], {
			caption: 'First',
		});
		const sketch = body.sketches[0]!;
		try {
			const first = await owner.json<{ sketch: SketchJson }>(`/api/sketches/${sketch.id}`, {
				method: 'PATCH',
				body: JSON.stringify({ caption: 'Ground floor, as found', roomId, version: 1 }),
			});
			expect(first.status).toBe(200);
			expect(first.body.sketch).toMatchObject({ caption: 'Ground floor, as found', roomId, version: 2 });

			const stale = await owner.json<ErrorBody>(`/api/sketches/${sketch.id}`, {
				method: 'PATCH',
				body: JSON.stringify({ caption: 'Overwrite', version: 1 }),
			});
			expect(stale.status).toBe(409);
			expect(stale.body.error.current?.version).toBe(2);
			expect(await db('sketches').where({ id: sketch.id }).first('caption', 'version')).toEqual({
				caption: 'Ground floor, as found',
				version: 2,
			});
			expect(await db('audit_log').where({ entity_id: sketch.id, action: 'update' }).count('* as n')).toEqual(
				[{ n: '1' }],
			);
		} finally {
			await removeAllSketches();
		}
	});

	test.each([
		['a caption over 200 characters', { caption: 'x'.repeat(201), version: 1 }, 'caption', /at most 200/],
		['a room id that is not an id', { roomId: 'kitchen', version: 1 }, 'roomId', /Choose a room/],
		['a missing version', { caption: 'ok' }, 'version', /version/],
	])('a change with %s is refused and changes nothing', async (_label, patch, field, message) => {
		const { body } = await upload(owner, [{ name: 'plan.png', type: 'image/png', bytes: png }], {
			caption: 'Kept',
		});
		const sketch = body.sketches[0]!;
		try {
			const res = await owner.json<ErrorBody>(`/api/sketches/${sketch.id}`, {
				method: 'PATCH',
				body: JSON.stringify(patch),
			});
			expect(res.status).toBe(400);
			expect(res.body.error.fields?.[field]?.join(' ')).toMatch(message);
			expect(await db('sketches').where({ id: sketch.id }).first('caption', 'version')).toEqual({
				caption: 'Kept',
				version: 1,
			});
		} finally {
			await removeAllSketches();
		}
	});

	test('deleting a sketch removes its row, its file and its thumbnail', async () => {
		const { body } = await upload(owner, [{ name: 'plan.png', type: 'image/png', bytes: png }]);
		const sketch = body.sketches[0]!;
		const row = await db('sketches').where({ id: sketch.id }).first('stored_name');
		const file = path.join(uploads, jobId, row.stored_name);
		expect(fs.existsSync(file) && fs.existsSync(`${file}.thumb.png`)).toBe(true);

		const res = await owner.fetch(`/api/sketches/${sketch.id}`, { method: 'DELETE' });
		expect(res.status).toBe(204);
		expect(await db('sketches').where({ id: sketch.id }).first()).toBeUndefined();
		expect(fs.existsSync(file)).toBe(false);
		expect(fs.existsSync(`${file}.thumb.png`)).toBe(false);
		expect((await owner.fetch(sketch.urls.file)).status).toBe(404);
		expect(await db('audit_log').where({ entity_id: sketch.id, action: 'delete' }).count('* as n')).toEqual([
			{ n: '1' },
		]);
		await removeAllSketches();
	});
});

describe('the demo job', () => {
	test('comes with its two floor-plan sketches, stored beside it and matching their checksums', async () => {
		const job = await db('jobs').where({ name: DEMO_JOB_DOCUMENT.name }).first('id');
		const listed = await homeowner.json<{ sketches: SketchJson[] }>(`/api/jobs/${job.id}/sketches`);
		expect(listed.status).toBe(200);
		expect(listed.body.sketches.map((s) => [s.originalName, s.contentType])).toEqual([
			['first-floor.png', 'image/png'],
			['basement.png', 'image/png'],
		]);
		for (const sketch of listed.body.sketches) {
			const seeded = fs.readFileSync(path.resolve('seeds/data/sketches', sketch.originalName));
			const served = Buffer.from(await (await homeowner.fetch(sketch.urls.file)).arrayBuffer());
			expect(sha256(served)).toBe(sha256(seeded));
			expect(sketch.sha256).toBe(sha256(seeded));
			expect((await homeowner.fetch(sketch.urls.thumbnail!)).headers.get('content-type')).toBe('image/png');
		}
		const rooms = await db('rooms')
			.whereIn(
				'id',
				listed.body.sketches.map((s) => s.roomId!),
			)
			.pluck('name');
		expect(rooms.sort()).toEqual(['Basement', 'Kitchen']);
	});
});

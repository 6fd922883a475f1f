/**
 * POST /api/jobs/:jobId/sketches: multipart upload of floor-plan sketches, handled in Express so that
 * multer streams the files to disk before anything is checked or recorded.
 */
import { getToken } from '@auth/core/jwt';
import type { Express, Request, Response } from 'express';
import { fileTypeFromFile } from 'file-type';
import multer from 'multer';
import { createHash, randomUUID } from 'node:crypto';
import { createReadStream } from 'node:fs';
import fs from 'node:fs/promises';
import { pipeline } from 'node:stream/promises';
import { PDFDocument } from 'pdf-lib';
import sharp, { type Metadata } from 'sharp';
import { assertJobAccess } from '../src/lib/access';
import { db } from '../src/lib/db';
import { AppError, errorBody, errors } from '../src/lib/errors';
import { loadCurrentUser } from '../src/lib/repositories/accounts';
import {
	assertRoomOfJob,
	insertSketches,
	jobFull,
	type NewSketch,
	sketchRoomLeft,
	toSketch,
} from '../src/lib/repositories/sketches';
import type { CurrentUser } from '../src/lib/roles';
import { sketchFieldsSchema } from '../src/lib/schemas/sketch';
import {
	cleanOriginalName,
	incomingDir,
	isSketchContentType,
	jobFolder,
	MAX_FILES_PER_UPLOAD,
	MAX_SKETCH_BYTES,
	MAX_SKETCH_MB,
	newStoredName,
	SKETCH_TYPES,
	sketchPaths,
	THUMBNAIL_WIDTH,
} from '../src/lib/sketch-storage';

const MAX_IMAGE_PIXELS = 100_000_000;

const upload = multer({
	storage: multer.diskStorage({
		destination(_req, _file, cb) {
			const dir = incomingDir();
			fs.mkdir(dir, { recursive: true }).then(
				() => cb(null, dir),
				(err: Error) => cb(err, dir),
			);
		},
		filename(_req, _file, cb) {
			cb(null, `${randomUUID()}.part`);
		},
	}),
	// File names arrive as UTF-8 from browsers and from fetch's FormData.
	defParamCharset: 'utf8',
	limits: {
		fileSize: MAX_SKETCH_BYTES,
		files: MAX_FILES_PER_UPLOAD,
		fields: 10,
		fieldSize: 4096,
		parts: MAX_FILES_PER_UPLOAD + 10,
	},
}).array('files');

/** A file that passed every check, waiting in the incoming folder to be moved beside its job. */
interface Checked {
	tempPath: string;
	thumbTempPath: string | null;
	row: Omit<NewSketch, 'caption' | 'room_id'>;
}

function displayName(file: Express.Multer.File): string {
	return cleanOriginalName(file.originalname, 'file').slice(0, 80);
}

/** Astro refuses cross-site form posts on its own routes; this route must too. The Origin's host must be
 * the Host the request came to, or one of ALLOWED_HOSTS (the production names astro.config.mjs allows). */
function assertSameOrigin(req: Request): void {
	const origin = req.headers.origin;
	let host: string | null = null;
	try {
		host = origin ? new URL(origin).host : null;
	} catch {
		host = null;
	}
	const allowed = (process.env.ALLOWED_HOSTS ?? '')
		.split(',')
		.map((h) => h.trim())
		.filter(Boolean);
	if (!host || (host !== req.headers.host && !allowed.includes(host))) {
		throw errors.forbidden('Uploads are accepted only from this site’s own pages.');
	}
}

/** The signed-in user from the Auth.js session cookie (the same JWT the Astro pages read). */
async function sessionUser(req: Request): Promise<CurrentUser> {
	const cookie = req.headers.cookie ?? '';
	const secureCookie = cookie.includes('__Secure-authjs.session-token');
	// Only the cookie is passed on: a session comes from the browser's cookie, not from a bearer header.
	const token = await getToken({
		req: { headers: { cookie } },
		secret: process.env.AUTH_SECRET,
		secureCookie,
	});
	const user = token?.sub ? await loadCurrentUser(db(), token.sub) : null;
	if (!user) throw errors.unauthenticated();
	return user;
}

function receive(req: Request, res: Response): Promise<void> {
	return new Promise((resolve, reject) => {
		upload(req, res, (err: unknown) => {
			if (!err) return resolve();
			if (err instanceof multer.MulterError) return reject(fromMulter(err));
			reject(err);
		});
	});
}

function fromMulter(err: multer.MulterError): AppError {
	const name = err.field === 'files' && (err as { filename?: string }).filename;
	switch (err.code) {
		case 'LIMIT_FILE_SIZE':
			return new AppError(
				'too_large',
				`“${name ? cleanOriginalName(name, 'file').slice(0, 80) : 'A file'}” is larger than ${MAX_SKETCH_MB} MB. Export it at a lower resolution or split it, then upload again.`,
			);
		case 'LIMIT_FILE_COUNT':
			return errors.invalid(`Upload at most ${MAX_FILES_PER_UPLOAD} files at a time.`);
		case 'LIMIT_UNEXPECTED_FILE':
			return errors.invalid('Send the sketches in the form field named “files”.');
		case 'LIMIT_FIELD_VALUE':
			return errors.invalid('A form field is too long.', {
				caption: ['A caption is at most 200 characters.'],
			});
		default:
			return errors.invalid('The upload could not be read. Please choose the files again.');
	}
}

async function sha256Of(file: string): Promise<string> {
	const hash = createHash('sha256');
	await pipeline(createReadStream(file), hash);
	return hash.digest('hex');
}

async function looksLikeSvg(file: string): Promise<boolean> {
	const handle = await fs.open(file);
	try {
		const { buffer, bytesRead } = await handle.read(Buffer.alloc(4096), 0, 4096, 0);
		return /<svg[\s>]/i.test(buffer.subarray(0, bytesRead).toString('utf8'));
	} finally {
		await handle.close();
	}
}

/** Checks one received file by its content and prepares its thumbnail; throws a 400/415 that names it. */
async function check(file: Express.Multer.File): Promise<Checked> {
	const name = displayName(file);
	if (file.size === 0) throw errors.invalid(`“${name}” is empty (0 bytes). Choose the file again.`);
	const detected = await fileTypeFromFile(file.path);
	if (!detected || !isSketchContentType(detected.mime)) {
		if (await looksLikeSvg(file.path)) {
			throw new AppError(
				'unsupported_type',
				`“${name}” is an SVG drawing. SVG files are not accepted because they can carry scripts; export the drawing as PNG or PDF and upload that.`,
			);
		}
		throw new AppError(
			'unsupported_type',
			`“${name}” is not a PNG, JPEG or PDF file${detected ? ` (it is ${detected.ext.toUpperCase()})` : ''}. Sketches must be PNG, JPEG or PDF; SVG and other formats are not accepted.`,
		);
	}
	const type = detected.mime;
	const base = {
		original_name: cleanOriginalName(file.originalname, SKETCH_TYPES[type]),
		stored_name: newStoredName(type),
		content_type: type,
		size_bytes: file.size,
		sha256: await sha256Of(file.path),
	};
	if (type === 'application/pdf') {
		let pages: number;
		try {
			pages = (
				await PDFDocument.load(await fs.readFile(file.path), { updateMetadata: false })
			).getPageCount();
		} catch (err) {
			const locked = (err as Error).name === 'EncryptedPDFError' || /encrypted/i.test((err as Error).message);
			throw new AppError(
				'unsupported_type',
				locked
					? `“${name}” is password-protected. Save a copy without a password and upload that.`
					: `“${name}” could not be read as a PDF. Save it again from the program that made it and upload that.`,
			);
		}
		if (pages < 1) throw new AppError('unsupported_type', `“${name}” has no pages.`);
		return {
			tempPath: file.path,
			thumbTempPath: null,
			row: { ...base, width: null, height: null, page_count: pages, has_thumbnail: false },
		};
	}
	const thumbTempPath = `${file.path}.thumb.part`;
	let meta: Metadata;
	try {
		meta = await sharp(file.path).metadata();
	} catch {
		throw unreadableImage(name);
	}
	// A small file can still decode to a huge bitmap; refuse it before decoding.
	if ((meta.width ?? 0) * (meta.height ?? 0) > MAX_IMAGE_PIXELS) {
		throw errors.invalid(
			`“${name}” is ${meta.width} × ${meta.height} pixels; sketches may be at most ${MAX_IMAGE_PIXELS / 1e6} megapixels. Export it at a lower resolution.`,
		);
	}
	try {
		await sharp(file.path, { limitInputPixels: MAX_IMAGE_PIXELS })
			.autoOrient()
			.resize({ width: THUMBNAIL_WIDTH, withoutEnlargement: true })
			.png()
			.toFile(thumbTempPath);
		const { width, height } = meta.autoOrient ?? meta;
		if (!width || !height) throw new Error('no dimensions');
		return {
			tempPath: file.path,
			thumbTempPath,
			row: { ...base, width, height, page_count: null, has_thumbnail: true },
		};
	} catch {
		await fs.rm(thumbTempPath, { force: true });
		throw unreadableImage(name);
	}
}

function unreadableImage(name: string): AppError {
	return new AppError(
		'unsupported_type',
		`“${name}” could not be read as an image. Save it again as PNG or JPEG and upload that.`,
	);
}

async function handleUpload(req: Request, res: Response): Promise<void> {
	let received: Express.Multer.File[] = [];
	const checked: Checked[] = [];
	const placed: string[] = [];
	try {
		assertSameOrigin(req);
		const user = await sessionUser(req);
		const jobId = String(req.params.jobId);
		await assertJobAccess(db(), user, jobId, 'write');
		// Refuse before reading the body when the job is already full.
		const left = await sketchRoomLeft(db(), jobId);
		if (left <= 0) throw jobFull(left);

		await receive(req, res);
		received = (req.files as Express.Multer.File[] | undefined) ?? [];
		if (received.length === 0) throw errors.invalid('Choose at least one PNG, JPEG or PDF file to upload.');
		if (received.length > left) throw jobFull(left);
		const fields = sketchFieldsSchema.safeParse({ caption: req.body?.caption, roomId: req.body?.roomId });
		if (!fields.success) throw errors.validation(fields.error);
		await assertRoomOfJob(db(), fields.data.roomId, jobId);

		for (const file of received) checked.push(await check(file));

		const folder = jobFolder(jobId);
		await fs.mkdir(folder, { recursive: true });
		const rows = await db().transaction(async (trx) => {
			for (const c of checked) {
				const { file, thumbnail } = sketchPaths({ job_id: jobId, stored_name: c.row.stored_name });
				placed.push(file);
				await fs.rename(c.tempPath, file);
				if (c.thumbTempPath) {
					placed.push(thumbnail);
					await fs.rename(c.thumbTempPath, thumbnail);
				}
			}
			return insertSketches(
				trx,
				jobId,
				user.id,
				checked.map((c) => ({ ...c.row, caption: fields.data.caption, room_id: fields.data.roomId })),
			);
		});
		placed.length = 0;
		await removeTemporaries();
		res.status(201).json({ sketches: rows.map(toSketch) });
	} catch (err) {
		// Clean up before answering, so that a client who sees the refusal finds nothing left.
		await Promise.allSettled(placed.map((p) => fs.rm(p, { force: true })));
		await removeTemporaries();
		sendError(req, res, err);
	}

	async function removeTemporaries() {
		await Promise.allSettled([
			...received.map((f) => fs.rm(f.path, { force: true })),
			...checked.flatMap((c) => (c.thumbTempPath ? [fs.rm(c.thumbTempPath, { force: true })] : [])),
		]);
	}
}

function sendError(req: Request, res: Response, err: unknown): void {
	if (res.headersSent) return;
	// A refusal before the body was read: let the rest of the body drain rather than reset the connection.
	if (!req.complete) req.resume();
	if (err instanceof AppError) {
		res.status(err.status).json(errorBody(err));
		return;
	}
	console.error('[ampledger] sketch upload failed', err);
	res
		.status(500)
		.json(
			errorBody(
				new AppError('internal', 'Something went wrong on our side. Nothing was saved; please try again.'),
			),
		);
}

/** Mounts the sketch upload route; call it before express.static and Astro's handler. */
export function mountSketchUpload(app: Express): void {
	app.post('/api/jobs/:jobId/sketches', (req, res) => {
		void handleUpload(req, res);
	});
}

/**
 * POST /api/jobs/:jobId/sketches: multipart upload of floor-plan sketches, handled in Express so that
 * multer streams the files to disk before anything is checked or recorded.
 */
import type { Express, Request, Response } from 'express';
import { fileTypeFromFile } from 'file-type';
import fs from 'node:fs/promises';
import { PDFDocument } from 'pdf-lib';
import { assertJobAccess } from '../src/lib/access';
import { db } from '../src/lib/db';
import { AppError, errors } from '../src/lib/errors';
import {
	assertRoomOfJob,
	insertSketches,
	jobFull,
	type NewSketch,
	sketchRoomLeft,
	toSketch,
} from '../src/lib/repositories/sketches';
import { sketchFieldsSchema } from '../src/lib/schemas/sketch';
import {
	cleanOriginalName,
	isSketchContentType,
	jobFolder,
	newStoredName,
	SKETCH_TYPES,
	sketchPaths,
} from '../src/lib/sketch-storage';
import {
	assertSameOrigin,
	checkImage,
	diskUpload,
	displayName,
	looksLikeSvg,
	receive,
	sendError,
	sessionUser,
	sha256Of,
} from './upload-common';

const upload = diskUpload();

/** A file that passed every check, waiting in the incoming folder to be moved beside its job. */
interface Checked {
	tempPath: string;
	thumbTempPath: string | null;
	row: Omit<NewSketch, 'caption' | 'room_id'>;
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
	const { width, height } = await checkImage(file, thumbTempPath, 'sketches');
	return {
		tempPath: file.path,
		thumbTempPath,
		row: { ...base, width, height, page_count: null, has_thumbnail: true },
	};
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

		await receive(upload, req, res, 'sketches');
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
		sendError(req, res, err, 'sketch');
	}

	async function removeTemporaries() {
		await Promise.allSettled([
			...received.map((f) => fs.rm(f.path, { force: true })),
			...checked.flatMap((c) => (c.thumbTempPath ? [fs.rm(c.thumbTempPath, { force: true })] : [])),
		]);
	}
}

/** Mounts the sketch upload route; call it before express.static and Astro's handler. */
export function mountSketchUpload(app: Express): void {
	app.post('/api/jobs/:jobId/sketches', (req, res) => {
		void handleUpload(req, res);
	});
}

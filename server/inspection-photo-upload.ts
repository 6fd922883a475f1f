/**
 * POST /api/inspections/:inspectionId/photos: photos of an inspection's result, uploaded by an
 * inspector of the job's jurisdiction. PNG and JPEG only, checked by content like sketches.
 */
import type { Express, Request, Response } from 'express';
import { fileTypeFromFile } from 'file-type';
import fs from 'node:fs/promises';
import { db } from '../src/lib/db';
import { AppError, errors } from '../src/lib/errors';
import { assertInspectionAccess } from '../src/lib/inspection-access';
import {
	inspectionPhotoFolder,
	inspectionPhotoPaths,
	isPhotoContentType,
	newPhotoName,
	PHOTO_TYPES,
} from '../src/lib/inspection-photo-storage';
import {
	insertInspectionPhotos,
	inspectionRow,
	MAX_PHOTOS_PER_INSPECTION,
	type NewInspectionPhoto,
	photoRoomLeft,
	toInspectionPhoto,
} from '../src/lib/repositories/inspections';
import { inspectionPhotoFieldsSchema } from '../src/lib/schemas/inspection';
import { cleanOriginalName } from '../src/lib/sketch-storage';
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

interface Checked {
	tempPath: string;
	thumbTempPath: string;
	row: Omit<NewInspectionPhoto, 'caption'>;
}

function full(left: number): AppError {
	return errors.invalid(
		left <= 0
			? `This inspection already has ${MAX_PHOTOS_PER_INSPECTION} photos, the most it takes.`
			: `This inspection takes ${left} more photo${left === 1 ? '' : 's'}; choose fewer files.`,
	);
}

/** Checks one received file by its content and makes its thumbnail; throws a 400/415 that names it. */
async function check(file: Express.Multer.File): Promise<Checked> {
	const name = displayName(file);
	if (file.size === 0) throw errors.invalid(`“${name}” is empty (0 bytes). Choose the file again.`);
	const detected = await fileTypeFromFile(file.path);
	if (!detected || !isPhotoContentType(detected.mime)) {
		throw new AppError(
			'unsupported_type',
			(await looksLikeSvg(file.path))
				? `“${name}” is an SVG drawing. Inspection photos must be PNG or JPEG.`
				: `“${name}” is not a PNG or JPEG photo${detected ? ` (it is ${detected.ext.toUpperCase()})` : ''}. Inspection photos must be PNG or JPEG.`,
		);
	}
	const type = detected.mime;
	const thumbTempPath = `${file.path}.thumb.part`;
	const { width, height } = await checkImage(file, thumbTempPath, 'photos');
	return {
		tempPath: file.path,
		thumbTempPath,
		row: {
			original_name: file.originalname?.trim()
				? cleanOriginalName(file.originalname, PHOTO_TYPES[type])
				: `photo.${PHOTO_TYPES[type]}`,
			stored_name: newPhotoName(type),
			content_type: type,
			size_bytes: file.size,
			sha256: await sha256Of(file.path),
			width,
			height,
			has_thumbnail: true,
		},
	};
}

async function handleUpload(req: Request, res: Response): Promise<void> {
	let received: Express.Multer.File[] = [];
	const checked: Checked[] = [];
	const placed: string[] = [];
	try {
		assertSameOrigin(req);
		const user = await sessionUser(req);
		const inspectionId = String(req.params.inspectionId);
		await assertInspectionAccess(db(), user, 'inspection', inspectionId, 'inspector');
		const inspection = (await inspectionRow(db(), inspectionId))!;
		if (inspection.status === 'requested' || inspection.status === 'cancelled') {
			throw errors.conflict('Photos are added once the inspection is scheduled.', {
				status: inspection.status,
			});
		}
		// Refuse before reading the body when the inspection is already full.
		const left = await photoRoomLeft(db(), inspectionId);
		if (left <= 0) throw full(left);

		await receive(upload, req, res, 'photos');
		received = (req.files as Express.Multer.File[] | undefined) ?? [];
		if (received.length === 0) throw errors.invalid('Choose at least one PNG or JPEG photo to upload.');
		if (received.length > left) throw full(left);
		const fields = inspectionPhotoFieldsSchema.safeParse({ caption: req.body?.caption ?? '' });
		if (!fields.success) throw errors.validation(fields.error);

		for (const file of received) checked.push(await check(file));

		await fs.mkdir(inspectionPhotoFolder(inspection.job_id), { recursive: true });
		const rows = await db().transaction(async (trx) => {
			for (const c of checked) {
				const { file, thumbnail } = inspectionPhotoPaths({
					job_id: inspection.job_id,
					stored_name: c.row.stored_name,
				});
				placed.push(file);
				await fs.rename(c.tempPath, file);
				placed.push(thumbnail);
				await fs.rename(c.thumbTempPath, thumbnail);
			}
			return insertInspectionPhotos(
				trx,
				inspection,
				user.id,
				checked.map((c) => ({ ...c.row, caption: fields.data.caption })),
			);
		});
		placed.length = 0;
		await removeTemporaries();
		res.status(201).json({ photos: rows.map(toInspectionPhoto) });
	} catch (err) {
		// Clean up before answering, so that a client who sees the refusal finds nothing left.
		await Promise.allSettled(placed.map((p) => fs.rm(p, { force: true })));
		await removeTemporaries();
		sendError(req, res, err, 'inspection photo');
	}

	async function removeTemporaries() {
		await Promise.allSettled([
			...received.map((f) => fs.rm(f.path, { force: true })),
			...checked.map((c) => fs.rm(c.thumbTempPath, { force: true })),
		]);
	}
}

/** Mounts the inspection photo upload route; call it before express.static and Astro's handler. */
export function mountInspectionPhotoUpload(app: Express): void {
	app.post('/api/inspections/:inspectionId/photos', (req, res) => {
		void handleUpload(req, res);
	});
}

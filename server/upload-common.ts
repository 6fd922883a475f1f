/**
 * What every multipart upload route shares: the same-site check, the session from the Auth.js
 * cookie, multer's disk storage in the incoming folder, content checks of images with sharp, the
 * sha256 of a file and the one JSON error answer.
 */
import { getToken } from '@auth/core/jwt';
import type { Request, Response } from 'express';
import multer from 'multer';
import { createHash, randomUUID } from 'node:crypto';
import { createReadStream } from 'node:fs';
import fs from 'node:fs/promises';
import { pipeline } from 'node:stream/promises';
import sharp, { type Metadata } from 'sharp';
import { db } from '../src/lib/db';
import { AppError, errorBody, errors } from '../src/lib/errors';
import { loadCurrentUser } from '../src/lib/repositories/accounts';
import type { CurrentUser } from '../src/lib/roles';
import {
	cleanOriginalName,
	incomingDir,
	MAX_FILES_PER_UPLOAD,
	MAX_SKETCH_BYTES,
	MAX_SKETCH_MB,
	THUMBNAIL_WIDTH,
} from '../src/lib/sketch-storage';

/** The largest bitmap an upload may decode to. */
export const MAX_IMAGE_PIXELS = 100_000_000;

/** A multer middleware that streams up to MAX_FILES_PER_UPLOAD files of the form field `files` into the incoming folder. */
export function diskUpload() {
	return multer({
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
}

/** A received file's name for messages. */
export function displayName(file: Express.Multer.File): string {
	return cleanOriginalName(file.originalname, 'file').slice(0, 80);
}

/** Astro refuses cross-site form posts on its own routes; upload routes must too. The Origin's host must be
 * the Host the request came to, or one of ALLOWED_HOSTS (the production names astro.config.mjs allows). */
export function assertSameOrigin(req: Request): void {
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
export async function sessionUser(req: Request): Promise<CurrentUser> {
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

/** Runs a multer middleware as a promise, turning multer's errors into ours (`what` names the files, e.g. “sketches”). */
export function receive(
	upload: ReturnType<typeof diskUpload>,
	req: Request,
	res: Response,
	what: string,
): Promise<void> {
	return new Promise((resolve, reject) => {
		upload(req, res, (err: unknown) => {
			if (!err) return resolve();
			if (err instanceof multer.MulterError) return reject(fromMulter(err, what));
			reject(err);
		});
	});
}

function fromMulter(err: multer.MulterError, what: string): AppError {
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
			return errors.invalid(`Send the ${what} in the form field named “files”.`);
		case 'LIMIT_FIELD_VALUE':
			return errors.invalid('A form field is too long.', {
				caption: ['A caption is at most 200 characters.'],
			});
		default:
			return errors.invalid('The upload could not be read. Please choose the files again.');
	}
}

/** The sha256 of a file on disk, in hex. */
export async function sha256Of(file: string): Promise<string> {
	const hash = createHash('sha256');
	await pipeline(createReadStream(file), hash);
	return hash.digest('hex');
}

/** Whether a file's first bytes are an SVG drawing (which file-type does not name). */
export async function looksLikeSvg(file: string): Promise<boolean> {
	const handle = await fs.open(file);
	try {
		const { buffer, bytesRead } = await handle.read(Buffer.alloc(4096), 0, 4096, 0);
		return /<svg[\s>]/i.test(buffer.subarray(0, bytesRead).toString('utf8'));
	} finally {
		await handle.close();
	}
}

function unreadableImage(name: string): AppError {
	return new AppError(
		'unsupported_type',
		`“${name}” could not be read as an image. Save it again as PNG or JPEG and upload that.`,
	);
}

/**
 * Decodes a PNG or JPEG with sharp (refusing bitmaps over MAX_IMAGE_PIXELS) and writes its
 * THUMBNAIL_WIDTH px PNG thumbnail beside it; returns the upright size. Throws a 400/415 naming the file.
 */
export async function checkImage(
	file: Express.Multer.File,
	thumbTempPath: string,
	what: string,
): Promise<{ width: number; height: number }> {
	const name = displayName(file);
	let meta: Metadata;
	try {
		meta = await sharp(file.path).metadata();
	} catch {
		throw unreadableImage(name);
	}
	// A small file can still decode to a huge bitmap; refuse it before decoding.
	if ((meta.width ?? 0) * (meta.height ?? 0) > MAX_IMAGE_PIXELS) {
		throw errors.invalid(
			`“${name}” is ${meta.width} × ${meta.height} pixels; ${what} may be at most ${MAX_IMAGE_PIXELS / 1e6} megapixels. Export it at a lower resolution.`,
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
		return { width, height };
	} catch {
		await fs.rm(thumbTempPath, { force: true });
		throw unreadableImage(name);
	}
}

/** Answers an upload's failure in the one JSON error shape (a generic 500 for the unexpected). */
export function sendError(req: Request, res: Response, err: unknown, what: string): void {
	if (res.headersSent) return;
	// A refusal before the body was read: let the rest of the body drain rather than reset the connection.
	if (!req.complete) req.resume();
	if (err instanceof AppError) {
		res.status(err.status).json(errorBody(err));
		return;
	}
	console.error(`[ampledger] ${what} upload failed`, err);
	res
		.status(500)
		.json(
			errorBody(
				new AppError('internal', 'Something went wrong on our side. Nothing was saved; please try again.'),
			),
		);
}

import { randomUUID } from 'node:crypto';
import fs from 'node:fs/promises';
import path from 'node:path';

/** The three kinds of file a sketch may be, with the extension its stored file gets. */
export const SKETCH_TYPES = {
	'image/png': 'png',
	'image/jpeg': 'jpg',
	'application/pdf': 'pdf',
} as const;
export type SketchContentType = keyof typeof SKETCH_TYPES;

export const MAX_SKETCH_BYTES = 20 * 1024 * 1024;
export const MAX_SKETCH_MB = 20;
export const MAX_FILES_PER_UPLOAD = 10;
export const MAX_SKETCHES_PER_JOB = 40;
export const THUMBNAIL_WIDTH = 480;

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const STORED_NAME = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}\.(png|jpg|pdf)$/;

export function isSketchContentType(value: string): value is SketchContentType {
	return Object.hasOwn(SKETCH_TYPES, value);
}

/** The folder all uploads live under: UPLOADS_DIR, or `uploads/` in the working directory. */
export function uploadsRoot(): string {
	return path.resolve(process.env.UPLOADS_DIR || path.join(process.cwd(), 'uploads'));
}

/** Where uploads are received before they are checked; never served. */
export function incomingDir(): string {
	return path.join(uploadsRoot(), '.incoming');
}

/** A job's folder. Only a uuid is accepted, so the path can never leave the uploads root. */
export function jobFolder(jobId: string): string {
	if (!UUID.test(jobId)) throw new Error(`not a job id: ${jobId}`);
	return path.join(uploadsRoot(), jobId.toLowerCase());
}

/** A fresh random stored name for a detected type. */
export function newStoredName(type: SketchContentType): string {
	return `${randomUUID()}.${SKETCH_TYPES[type]}`;
}

/** The paths of a sketch's file and thumbnail, built only from its database row. */
export function sketchPaths(row: { job_id: string; stored_name: string }): {
	file: string;
	thumbnail: string;
} {
	if (!STORED_NAME.test(row.stored_name)) throw new Error(`not a stored sketch name: ${row.stored_name}`);
	const file = path.join(jobFolder(row.job_id), row.stored_name);
	return { file, thumbnail: `${file}.thumb.png` };
}

/** Removes a sketch's file and thumbnail; a file already gone is not an error. */
export async function removeSketchFiles(row: { job_id: string; stored_name: string }): Promise<void> {
	const { file, thumbnail } = sketchPaths(row);
	await Promise.all([fs.rm(file, { force: true }), fs.rm(thumbnail, { force: true })]);
}

/** An original file name as plain text for display and download headers: no folders, no control
 * characters, at most 200 characters. */
export function cleanOriginalName(name: string | undefined, fallbackExt: string): string {
	const base = (name ?? '')
		.split(/[\\/]/)
		.pop()!
		.replace(/[\u0000-\u001f\u007f]/g, '')
		.trim()
		.slice(0, 200);
	return base && base !== '.' && base !== '..' ? base : `sketch.${fallbackExt}`;
}

/** A Content-Disposition value that shows the file inline under a safe name. */
export function inlineDisposition(name: string): string {
	const ascii = name.replace(/[^\x20-\x7e]/g, '_').replace(/["\\;]/g, '_');
	const encoded = encodeURIComponent(name).replace(
		/['()*]/g,
		(c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`,
	);
	return `inline; filename="${ascii}"; filename*=UTF-8''${encoded}`;
}

import { randomUUID } from 'node:crypto';
import path from 'node:path';
import { jobFolder } from './sketch-storage';

/** The two kinds of file an inspection photo may be, with the extension its stored file gets. */
export const PHOTO_TYPES = { 'image/png': 'png', 'image/jpeg': 'jpg' } as const;
export type PhotoContentType = keyof typeof PHOTO_TYPES;

const STORED_NAME = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}\.(png|jpg)$/;

export function isPhotoContentType(value: string): value is PhotoContentType {
	return Object.hasOwn(PHOTO_TYPES, value);
}

/** A fresh random stored name for a detected type. */
export function newPhotoName(type: PhotoContentType): string {
	return `${randomUUID()}.${PHOTO_TYPES[type]}`;
}

/** The folder of a job's inspection photos: UPLOADS_DIR/<jobId>/inspections. */
export function inspectionPhotoFolder(jobId: string): string {
	return path.join(jobFolder(jobId), 'inspections');
}

/** The paths of a photo's file and thumbnail, built only from its database row. */
export function inspectionPhotoPaths(row: { job_id: string; stored_name: string }): {
	file: string;
	thumbnail: string;
} {
	if (!STORED_NAME.test(row.stored_name)) throw new Error(`not a stored photo name: ${row.stored_name}`);
	const file = path.join(inspectionPhotoFolder(row.job_id), row.stored_name);
	return { file, thumbnail: `${file}.thumb.png` };
}

import fs from 'node:fs';
import { Readable } from 'node:stream';
import { errors } from './errors';
import { inspectionPhotoPaths, PHOTO_TYPES } from './inspection-photo-storage';
import type { InspectionPhotoRow } from './repositories/inspections';
import { cleanOriginalName, inlineDisposition } from './sketch-storage';

/** A response with an inspection photo or its thumbnail, read from the path its row names. */
export async function inspectionPhotoResponse(
	photo: InspectionPhotoRow,
	which: 'file' | 'thumbnail',
): Promise<Response> {
	if (which === 'thumbnail' && !photo.has_thumbnail) throw errors.notFound('thumbnail');
	const file = inspectionPhotoPaths(photo)[which];
	let size: number;
	try {
		size = (await fs.promises.stat(file)).size;
	} catch {
		console.error('[ampledger] inspection photo missing on disk', photo.id, which);
		throw errors.notFound(which === 'file' ? 'photo file' : 'thumbnail');
	}
	const name = cleanOriginalName(photo.original_name, PHOTO_TYPES[photo.content_type]);
	const shown = which === 'file' ? name : `${name.replace(/\.[^.]*$/, '')}-thumbnail.png`;
	const body = Readable.toWeb(fs.createReadStream(file)) as ReadableStream<Uint8Array>;
	return new Response(body, {
		status: 200,
		headers: {
			'Content-Type': which === 'file' ? photo.content_type : 'image/png',
			'Content-Length': String(size),
			'Content-Disposition': inlineDisposition(shown),
			'X-Content-Type-Options': 'nosniff',
			'Cache-Control': 'private, no-cache',
			ETag: `"${photo.sha256.slice(0, 32)}${which === 'thumbnail' ? '-t' : ''}"`,
		},
	});
}

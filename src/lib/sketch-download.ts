import fs from 'node:fs';
import { Readable } from 'node:stream';
import { errors } from './errors';
import type { SketchRow } from './repositories/sketches';
import { cleanOriginalName, inlineDisposition, sketchPaths, SKETCH_TYPES } from './sketch-storage';

/** A response with a sketch's file or thumbnail, read from the path its row names. */
export async function sketchFileResponse(sketch: SketchRow, which: 'file' | 'thumbnail'): Promise<Response> {
	if (which === 'thumbnail' && !sketch.has_thumbnail) throw errors.notFound('thumbnail');
	const paths = sketchPaths(sketch);
	const file = paths[which];
	let size: number;
	try {
		size = (await fs.promises.stat(file)).size;
	} catch {
		console.error('[ampledger] sketch file missing on disk', sketch.id, which);
		throw errors.notFound(which === 'file' ? 'sketch file' : 'thumbnail');
	}
	const name = cleanOriginalName(sketch.original_name, SKETCH_TYPES[sketch.content_type]);
	const shown = which === 'file' ? name : `${name.replace(/\.[^.]*$/, '')}-thumbnail.png`;
	const body = Readable.toWeb(fs.createReadStream(file)) as ReadableStream<Uint8Array>;
	return new Response(body, {
		status: 200,
		headers: {
			'Content-Type': which === 'file' ? sketch.content_type : 'image/png',
			'Content-Length': String(size),
			'Content-Disposition': inlineDisposition(shown),
			'X-Content-Type-Options': 'nosniff',
			'Cache-Control': 'private, no-cache',
			ETag: `"${sketch.sha256.slice(0, 32)}${which === 'thumbnail' ? '-t' : ''}"`,
		},
	});
}

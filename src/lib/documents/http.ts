/** What the document endpoints share: paper size from the query, the PDF response, the request's document data. */
import type { APIContext } from 'astro';
import type { Knex } from 'knex';
import { errors } from '../errors';
import type { JobTree } from '../job-document';
import { mapLink } from '../panel-map-token';
import { ensureMapToken, liveMapToken } from '../repositories/panel-map-tokens';
import type { CurrentUser } from '../roles';
import type { PaperSize } from './types';

/** `?size=letter|a4` (letter when absent); anything else is a 400. */
export function paperSize(url: URL): PaperSize {
	const size = url.searchParams.get('size') ?? 'letter';
	if (size !== 'letter' && size !== 'a4') {
		throw errors.invalid('Choose a paper size: letter or a4.', { size: ['must be letter or a4'] });
	}
	return size;
}

/** A PDF answer: shown in the browser, or saved when `?download=1`. */
export function pdfResponse(bytes: Uint8Array, fileName: string, url: URL): Response {
	const safe = fileName.replace(/[^A-Za-z0-9._-]+/g, '-').replace(/-+/g, '-');
	const disposition = url.searchParams.get('download') === '1' ? 'attachment' : 'inline';
	return new Response(bytes as Uint8Array<ArrayBuffer>, {
		status: 200,
		headers: {
			'Content-Type': 'application/pdf',
			'Content-Length': String(bytes.byteLength),
			'Content-Disposition': `${disposition}; filename="${safe}"`,
			'Cache-Control': 'private, no-store',
			'X-Content-Type-Options': 'nosniff',
		},
	});
}

/** The panel of the job named in the route, or 404. */
export function panelOf(tree: JobTree, panelId: string | undefined): JobTree['panels'][number] {
	const panel = tree.panels.find((p) => p.id === panelId);
	if (!panel) throw errors.notFound('panel');
	return panel;
}

/**
 * The panel map link for a directory card. The firm's people get one issued when the job has none;
 * a homeowner sees the live one, or none (they can sign in to see the map).
 */
export async function cardMapUrl(
	knex: Knex,
	ctx: APIContext,
	user: CurrentUser,
	job: { id: string; firm_id: string },
): Promise<string | null> {
	const firmMember = user.firms.some((f) => f.id === job.firm_id);
	const live = firmMember ? await ensureMapToken(knex, job.id, user.id) : await liveMapToken(knex, job.id);
	return live?.token ? mapLink(live.token, ctx.url.origin) : null;
}

/** File names like "panel-schedule-Main-2026-12-02.pdf". */
export function documentFileName(kind: string, name: string): string {
	return `${kind}-${name}-${new Date().toISOString().slice(0, 10)}.pdf`;
}

import { route } from '../../../../../../lib/api';
import { assertJobAccess } from '../../../../../../lib/access';
import { db } from '../../../../../../lib/db';
import {
	cardMapUrl,
	documentFileName,
	panelOf,
	paperSize,
	pdfResponse,
} from '../../../../../../lib/documents/http';
import { jobDocumentData, jobTreeOr404 } from '../../../../../../lib/documents/job-documents';
import { renderDocument } from '../../../../../../lib/documents/render-pool';
import { requireUser } from '../../../../../../lib/roles';

/** The directory card of one panel (PDF) with the panel map's QR code, for the firm's people and the home's owner. */
export const GET = route(async (ctx) => {
	const { params, url, locals } = ctx;
	const user = requireUser(locals.user);
	const size = paperSize(url);
	const job = await assertJobAccess(db(), user, params.id ?? '', 'read');
	const tree = await jobTreeOr404(db(), job.id);
	const panel = panelOf(tree, params.panelId);
	const mapUrl = await cardMapUrl(db(), ctx, user, job);
	const data = await jobDocumentData(db(), tree, { mapUrl });
	const bytes = await renderDocument({ kind: 'directory-card', data, panelId: panel.id, size });
	return pdfResponse(bytes, documentFileName('directory-card', panel.name), url);
});

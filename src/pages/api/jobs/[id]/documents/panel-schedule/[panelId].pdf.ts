import { route } from '../../../../../../lib/api';
import { assertJobAccess } from '../../../../../../lib/access';
import { db } from '../../../../../../lib/db';
import { documentFileName, panelOf, paperSize, pdfResponse } from '../../../../../../lib/documents/http';
import { jobDocumentData, jobTreeOr404 } from '../../../../../../lib/documents/job-documents';
import { renderDocument } from '../../../../../../lib/documents/render-pool';
import { requireUser } from '../../../../../../lib/roles';

/** The panel schedule of one panel (PDF), for the firm's people and the home's owner. */
export const GET = route(async ({ params, url, locals }) => {
	const user = requireUser(locals.user);
	const size = paperSize(url);
	const job = await assertJobAccess(db(), user, params.id ?? '', 'read');
	const tree = await jobTreeOr404(db(), job.id);
	const panel = panelOf(tree, params.panelId);
	const data = await jobDocumentData(db(), tree, { mapUrl: null });
	const bytes = await renderDocument({ kind: 'panel-schedule', data, panelId: panel.id, size });
	return pdfResponse(bytes, documentFileName('panel-schedule', panel.name), url);
});

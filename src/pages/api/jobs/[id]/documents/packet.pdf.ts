import { route } from '../../../../../lib/api';
import { assertJobAccess } from '../../../../../lib/access';
import { db } from '../../../../../lib/db';
import { documentFileName, paperSize, pdfResponse } from '../../../../../lib/documents/http';
import { jobDocumentData, jobTreeOr404 } from '../../../../../lib/documents/job-documents';
import { renderDocument } from '../../../../../lib/documents/render-pool';
import { requireUser } from '../../../../../lib/roles';

/** The permit packet (PDF), for the firm's people; rendered in the documents worker. */
export const GET = route(async ({ params, url, locals }) => {
	const user = requireUser(locals.user);
	const size = paperSize(url);
	const job = await assertJobAccess(db(), user, params.id ?? '', 'write');
	const tree = await jobTreeOr404(db(), job.id);
	const data = await jobDocumentData(db(), tree, { mapUrl: null, withSketches: true });
	const bytes = await renderDocument({ kind: 'packet', data, size });
	return pdfResponse(bytes, documentFileName('permit-packet', tree.job.name), url);
});

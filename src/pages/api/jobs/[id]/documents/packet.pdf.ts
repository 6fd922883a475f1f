import { route } from '../../../../../lib/api';
import { assertJobAccess } from '../../../../../lib/access';
import { db } from '../../../../../lib/db';
import { documentFileName, paperSize, pdfResponse } from '../../../../../lib/documents/http';
import { jobDocumentData, jobTreeOr404 } from '../../../../../lib/documents/job-documents';
import { renderDocument } from '../../../../../lib/documents/render-pool';
import { storedPacketResponse } from '../../../../../lib/documents/stored-packet';
import { errors } from '../../../../../lib/errors';
import { getRevisionPacket } from '../../../../../lib/repositories/revisions';
import { requireUser } from '../../../../../lib/roles';

/**
 * The permit packet (PDF). The firm's people get the live job's, rendered in the documents worker
 * and marked as a draft of the next revision; everyone else who reads the job (its inspectors, the
 * homeowner, administrators) gets the latest submitted revision's stored packet, or 404 before one.
 */
export const GET = route(async ({ params, url, locals }) => {
	const user = requireUser(locals.user);
	const size = paperSize(url);
	const job = await assertJobAccess(db(), user, params.id ?? '', 'read');
	if (!user.firms.some((f) => f.id === job.firm_id)) {
		const stored = await getRevisionPacket(db(), job.id, null);
		if (!stored) throw errors.notFound('submitted packet');
		return storedPacketResponse(stored, url);
	}
	const tree = await jobTreeOr404(db(), job.id);
	const data = await jobDocumentData(db(), tree, { mapUrl: null, withSketches: true });
	const bytes = await renderDocument({ kind: 'packet', data, size });
	return pdfResponse(bytes, documentFileName('permit-packet', tree.job.name), url);
});

import { route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { assertInspectionAccess } from '../../../../lib/inspection-access';
import { inspectionPhotoResponse } from '../../../../lib/inspection-photo-download';
import { getInspectionPhoto } from '../../../../lib/repositories/inspections';
import { requireUser } from '../../../../lib/roles';

/** The photo's 480 px PNG thumbnail, to anyone who may read its job. */
export const GET = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	await assertInspectionAccess(db(), user, 'photo', params.id, 'read');
	return inspectionPhotoResponse((await getInspectionPhoto(db(), params.id!))!, 'thumbnail');
});

import { STUDY_ROLES } from '$lib/studies';
import { requireRole } from '../guard';

/** Studies, organism profiles and vessels: engineers and media scientists see and edit them. */
export function requireStudyAccess() {
	return requireRole(...STUDY_ROLES);
}

import { endpoint } from '$lib/server/api/endpoint';
import { listStudies } from '$lib/server/studies/queries';
import { STUDY_ROLES } from '$lib/studies';

export const GET = endpoint({ access: { roles: [...STUDY_ROLES] } }, () => ({ studies: listStudies() }));

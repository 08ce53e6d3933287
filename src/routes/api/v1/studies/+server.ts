import { endpoint } from '$lib/server/api/endpoint';
import { listStudies } from '$lib/server/studies/queries';

export const GET = endpoint({ act: 'study.use' }, () => ({ studies: listStudies() }));

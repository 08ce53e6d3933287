import { endpoint } from '$lib/server/api/endpoint';
import { lotView } from '$lib/server/inventory/view';

export const GET = endpoint({ act: 'lot.view' }, ({ event }) => lotView(event.params.id!));

import { endpoint } from '$lib/server/api/endpoint';
import { batchView } from '$lib/server/batches/view';

export const GET = endpoint({ access: { roles: [] } }, ({ event }) => batchView(event.params.id!));

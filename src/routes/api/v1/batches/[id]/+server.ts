import { endpoint } from '$lib/server/api/endpoint';
import { batchView } from '$lib/server/batches/view';

export const GET = endpoint({ act: 'batch.view' }, ({ event }) => batchView(event.params.id!));

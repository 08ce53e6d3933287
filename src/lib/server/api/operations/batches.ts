export const batchesOperations: import('../openapi').ApiOperation[] = [];

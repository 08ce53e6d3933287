// Growth parameters from run data: the methods are described at the top of ./fit.ts.
export * from './fit';
export * from './schema';

// Growth stoichiometry by element balances: the method is described at the top of ./solve.ts.
export * from './solve';
export * from './schema';

// Whether a recipe supplies what a target biomass needs: the method is described at the top of ./assess.ts.
export * from './assess';
export * from './schema';

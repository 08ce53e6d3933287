// A run's data against its plan: gas exchange from off-gas, the comparison and projection, and the
// growth values read back from it.
export * from './series';
export * from './gas-exchange';
export * from './plan-comparison';
export * from './learn';

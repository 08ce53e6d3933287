import { benches } from './simulation.bench';
for (let i = 0; i < 10; i++) benches[0].run();
const t0 = performance.now();
let r: any;
for (let i = 0; i < 20; i++) r = benches[0].run();
console.log('avg', (performance.now() - t0) / 20, r.integratorSteps, r.quasiSteadyOxygenH);

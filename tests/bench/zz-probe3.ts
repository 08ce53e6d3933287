import { simulateRun } from '../../chemistry/simulation';
const r = simulateRun({ mode: 'batch', kinetics: { muMaxPerH: 0.5, ksGPerL: 0.1, yieldXS: 0.5, yieldXO2: 1, koMgPerL: 0.2 }, initial: { biomassGPerL: 0.1, substrateGPerL: 20, volumeL: 1 }, oxygen: { kLaPerH: 100, saturationMgPerL: 7 }, endH: 5, outputEveryH: 0.01 });
const c = r.dissolvedOxygenMgPerL!;
let worst = 0, wi = 0;
for (let i = 1; i < r.t.length - 1; i++) {
  const slope = (c[i + 1] - c[i - 1]) / (r.t[i + 1] - r.t[i - 1]);
  const balance = 100 * (7 - c[i]) - r.ourMmolPerLH![i] * 31.998;
  if (Math.abs(slope - balance) > worst) { worst = Math.abs(slope - balance); wi = i; }
}
console.log(worst, wi, r.t[wi], c.slice(wi - 2, wi + 3), r.quasiSteadyOxygenH);
for (const i of [1, 2, 3, 10, 50]) { const slope = (c[i + 1] - c[i - 1]) / 0.02; console.log(r.t[i], slope, 100 * (7 - c[i]) - r.ourMmolPerLH![i] * 31.998); }

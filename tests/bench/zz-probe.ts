import { simulateRun } from '../../chemistry/simulation';
const cases: Record<string, any> = {
  ecoliExpFeed: { mode: 'fedBatch', kinetics: { muMaxPerH: 0.7, ksGPerL: 0.05, yieldXS: 0.5, maintenanceGPerGH: 0.04, yieldXO2: 1.1, koMgPerL: 0.1, alpha: 0.1 }, initial: { biomassGPerL: 10, substrateGPerL: 0.01, volumeL: 1 }, feed: { strategy: 'exponential', substrateGPerL: 500, muSetPerH: 0.25 }, oxygen: { kLaPerH: 500, saturationMgPerL: 7, maintenanceMgPerGH: 5 }, maxVolumeL: 2, endH: 20, outputEveryH: 0.1 },
  chemostatO2: { mode: 'chemostat', kinetics: { muMaxPerH: 0.5, ksGPerL: 0.1, yieldXS: 0.5, yieldXO2: 1, koMgPerL: 0.2, beta: 0.01 }, initial: { biomassGPerL: 0.5, substrateGPerL: 10, volumeL: 1 }, feed: { strategy: 'constant', substrateGPerL: 10, startH: 5 }, oxygen: { kLaPerH: 300, saturationMgPerL: 7 }, dilutionPerH: 0.2, endH: 200, outputEveryH: 0.5 },
  drawFillO2: { mode: 'drawFill', kinetics: { muMaxPerH: 0.3, ksGPerL: 0.1, yieldXS: 0.5, yieldXO2: 1, koMgPerL: 0.2, alpha: 0.2 }, initial: { biomassGPerL: 0.5, substrateGPerL: 10, volumeL: 1 }, feed: { strategy: 'constant', substrateGPerL: 10 }, oxygen: { kLaPerH: 100, saturationMgPerL: 7 }, drawFill: { fraction: 0.5, everyH: 12 }, endH: 240, outputEveryH: 0.25 },
  fedDOlimited: { mode: 'fedBatch', kinetics: { muMaxPerH: 0.6, ksGPerL: 0.05, yieldXS: 0.5, yieldXO2: 1, koMgPerL: 0.2 }, initial: { biomassGPerL: 1, substrateGPerL: 20, volumeL: 1 }, feed: { strategy: 'constant', substrateGPerL: 500, rateLPerH: 0.02, startH: 6 }, oxygen: { kLaPerH: 400, saturationMgPerL: 7 }, maxVolumeL: 1.5, endH: 30, outputEveryH: 0.1 },
};
for (const [name, req] of Object.entries(cases)) {
  const t0 = performance.now();
  try {
    const r = simulateRun(req);
    console.log(name, (performance.now() - t0).toFixed(0), 'ms', r.integratorSteps, r.stoppedAtH, r.events.filter(e=>e.kind!=='draw').map(e=>e.kind+'@'+e.tH.toFixed(2)).join(' '), 'X', r.biomassGPerL.at(-1)?.toFixed(3), 'S', r.substrateGPerL.at(-1)?.toExponential(2), 'DO', r.dissolvedOxygenMgPerL?.at(-1)?.toFixed(3), 'P', r.productGPerL.at(-1)?.toFixed(3), 'V', r.volumeL.at(-1)?.toFixed(3));
  } catch (e) { console.log(name, (performance.now() - t0).toFixed(0), 'ms ERR', (e as Error).message); }
}

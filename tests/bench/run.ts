import type { BenchCase, Scenario, ScenarioFigure } from './bench';

async function loadCases(): Promise<BenchCase[]> {
	const { readdirSync } = await import('node:fs');
	const { dirname, join } = await import('node:path');
	const { fileURLToPath, pathToFileURL } = await import('node:url');
	const here = dirname(fileURLToPath(import.meta.url));
	// Each *.bench.ts here exports `benches: BenchCase[]`; discovering them means adding one needs no edit.
	const files = readdirSync(here).filter((f) => f.endsWith('.bench.ts'));
	const cases: BenchCase[] = [];
	for (const file of files.sort()) {
		const mod = (await import(pathToFileURL(join(here, file)).href)) as { benches: BenchCase[] };
		cases.push(...mod.benches);
	}
	return cases;
}

async function loadScenarios(): Promise<[string, Scenario][]> {
	const { readdirSync } = await import('node:fs');
	const { dirname, join } = await import('node:path');
	const { fileURLToPath, pathToFileURL } = await import('node:url');
	const here = dirname(fileURLToPath(import.meta.url));
	const files = readdirSync(here)
		.filter((f) => f.endsWith('.scenario.ts') && (!only || f.includes(only)))
		.sort();
	const scenarios: [string, Scenario][] = [];
	for (const file of files) {
		const mod = (await import(pathToFileURL(join(here, file)).href)) as { scenario: Scenario };
		scenarios.push([file, mod.scenario]);
	}
	return scenarios;
}

function median(values: number[]): number {
	const sorted = [...values].sort((a, b) => a - b);
	const mid = Math.floor(sorted.length / 2);
	return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

function timeCase(bench: BenchCase): { medianMs: number; p90Ms: number; repetitions: number } {
	for (let i = 0; i < 3; i++) bench.run(); // warm-up: let the JIT settle before timing
	const repetitions = bench.repetitions ?? 200;
	const samples: number[] = [];
	for (let i = 0; i < repetitions; i++) {
		const start = process.hrtime.bigint();
		bench.run();
		samples.push(Number(process.hrtime.bigint() - start) / 1e6);
	}
	samples.sort((a, b) => a - b);
	return {
		medianMs: median(samples),
		p90Ms: samples[Math.floor(samples.length * 0.9)],
		repetitions
	};
}

const only = process.argv.find((a) => a.startsWith('--only='))?.slice('--only='.length);
const cases = (await loadCases()).filter((c) => !only || c.name.includes(only));
let failures = 0;
console.log(
	'benchmark'.padEnd(58),
	'median ms'.padStart(10),
	'p90 ms'.padStart(10),
	'target'.padStart(8),
	'ratio'.padStart(7)
);
for (const bench of cases) {
	let timing: ReturnType<typeof timeCase>;
	try {
		timing = timeCase(bench);
	} catch (cause) {
		failures++;
		console.log(bench.name.padEnd(58), `FAILED: ${(cause as Error).message}`);
		continue;
	}
	const { medianMs, p90Ms } = timing;
	const ratio = medianMs / bench.targetMs;
	if (ratio > 1) failures++;
	console.log(
		bench.name.padEnd(58),
		medianMs.toFixed(4).padStart(10),
		p90Ms.toFixed(4).padStart(10),
		`${bench.targetMs}`.padStart(8),
		`${ratio.toFixed(3)}${ratio <= 1 ? ' ' : '!'}`.padStart(7)
	);
}
console.log('ratio = median / target; a ratio above 1 (marked !) misses its target.');

for (const [file, scenario] of await loadScenarios()) {
	console.log(`\n${file}`);
	let figures: ScenarioFigure[];
	try {
		figures = await scenario();
	} catch (cause) {
		failures++;
		console.log(`  FAILED: ${(cause as Error).message}`);
		continue;
	}
	for (const figure of figures) {
		const value = `${figure.value.toFixed(figure.value < 10 ? 2 : 0)} ${figure.unit}`.padStart(14);
		if (figure.target === undefined) {
			console.log(`  ${figure.name.padEnd(56)}`, value);
			continue;
		}
		const ratio = figure.value / figure.target;
		if (ratio > 1) failures++;
		console.log(
			`  ${figure.name.padEnd(56)}`,
			value,
			`target ${figure.target} ${figure.unit}`.padStart(18),
			`${ratio.toFixed(3)}${ratio <= 1 ? ' ' : '!'}`.padStart(8)
		);
	}
}
// A missed target fails the command: the benchmark runs on demand, and a miss must be seen.
if (failures) {
	console.log(`\n${failures} figure(s) missed their target or failed.`);
	process.exitCode = 1;
}

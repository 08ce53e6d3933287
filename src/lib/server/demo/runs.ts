// The demo's measured kLa map for the bench vessel and one yeast run with its data. Every number is
// invented for the Pilot Plant North scenario: smooth curves with a little scatter, not a real run.
import { eq } from 'drizzle-orm';
import { computeOperatingPoint } from '$chemistry';
import { findUserByEmail } from '../people';
import { db } from '../db';
import { run, study, vessel, vesselKlaPoint } from '../db/schema';
import { readPointObjects } from '../runs/read-points';
import { createRun } from '../runs/run-store';
import { storePoints } from '../runs/store-points';
import { vesselGeometry } from '../vessels/kla-map';

const BENCH_VESSEL = 'Bench stirred tank BST-10';
const DEMO_STUDY = 'Yeast glycerol fed-batch, bench (demo)';
const DEMO_RUN_NAME = 'Yeast glycerol fed-batch, bench, first run (demo)';

/** [rpm, L/min, kLa 1/h]: six invented bench measurements over the vessel's range. */
const BENCH_KLA: [number, number, number][] = [
	[400, 4, 78],
	[400, 10, 118],
	[600, 6, 176],
	[800, 8, 305],
	[800, 12, 372],
	[1000, 10, 505]
];

function seedKlaMap(actorId: string): number {
	const row = db.select().from(vessel).where(eq(vessel.name, BENCH_VESSEL)).get();
	if (!row) return 0;
	if (db.select().from(vesselKlaPoint).where(eq(vesselKlaPoint.vesselId, row.id)).get()) return 0;
	const geometry = vesselGeometry(row);
	if (!geometry) return 0;
	BENCH_KLA.forEach(([rpm, flow, kLa], i) => {
		const point = computeOperatingPoint({
			...geometry,
			agitationRpm: rpm,
			gasFlowLPerMin: flow,
			liquidVolumeL: 8
		});
		db.insert(vesselKlaPoint)
			.values({
				vesselId: row.id,
				measuredOn: `2026-10-${String(5 + i).padStart(2, '0')}`,
				method: 'entered',
				agitationRpm: rpm,
				gasFlowLPerMin: flow,
				liquidVolumeL: 8,
				powerPerVolumeWPerM3: point.powerPerVolumeWPerM3,
				powerSource: 'powerNumber',
				superficialVelocityMPerS: point.superficialVelocityMPerS,
				temperatureC: 30,
				kLaPerH: kLa,
				kLaLowPerH: kLa * 0.94,
				kLaHighPerH: kLa * 1.06,
				notes: 'Demo value, invented.',
				createdById: actorId
			})
			.run();
	});
	return BENCH_KLA.length;
}

/** A small repeatable scatter (no Math.random, so the demo is the same on every machine). */
const wobble = (i: number, size: number) => size * Math.sin(i * 12.9898) * 0.5;

/** 20 h of a yeast culture growing at μ 0.2 1/h on 6 L: online every 5 minutes, samples every 2 h. */
function demoPoints(): Record<string, number | null>[] {
	const points: Record<string, number | null>[] = [];
	const volumeL = 6;
	const gasMolPerH = (8 * 60) / 22.414;
	for (let minute = 0; minute <= 20 * 60; minute += 5) {
		const tH = minute / 60;
		const x = 0.2 * Math.exp(0.2 * tH);
		// qO2 = μ/(Yx/O2·M_O2) with the demo profile's Yx/O2 of 0.9 g/g: 6.9 mmol/g/h
		const ourMmolPerLH = 6.9 * x + wobble(minute, 0.6);
		const uptakeMolPerH = (ourMmolPerLH * volumeL) / 1000;
		const sample = minute % 120 === 0;
		points.push({
			time_h: Number(tH.toFixed(4)),
			// C = C* − OUR/kLa with the bench vessel's kLa of 400 1/h and C* of 0.235 mmol/L (air, 30 °C)
			do_percent: Number(
				Math.max(5, 100 * (1 - ourMmolPerLH / (400 * 0.235)) + wobble(minute, 1)).toFixed(1)
			),
			ph: Number((5.0 + wobble(minute, 0.04)).toFixed(2)),
			temperature_c: Number((30 + wobble(minute, 0.1)).toFixed(2)),
			agitation_rpm: 800,
			gas_flow_l_per_min: 8,
			exhaust_o2_percent: Number((20.95 - (100 * uptakeMolPerH) / gasMolPerH).toFixed(3)),
			exhaust_co2_percent: Number((0.04 + (100 * 1.02 * uptakeMolPerH) / gasMolPerH).toFixed(3)),
			dry_weight_g_per_l: sample ? Number((x * (1 + wobble(minute, 0.04))).toFixed(3)) : null,
			substrate_g_per_l: sample
				? Number(Math.max(0, 40 - (x - 0.2) / 0.5 + wobble(minute, 0.1)).toFixed(2))
				: null
		});
	}
	return points;
}

function seedRun(actor: { id: string; email: string }): number {
	if (db.select().from(run).where(eq(run.name, DEMO_RUN_NAME)).get()) return 0;
	const plan = db.select().from(study).where(eq(study.name, DEMO_STUDY)).get();
	if (!plan) return 0;
	const created = createRun(actor, {
		name: DEMO_RUN_NAME,
		studyId: plan.id,
		vesselId: '',
		profileId: '',
		startedAt: '2026-11-16T08:00',
		gasReferenceTemperatureC: 0,
		gasReferencePressureKPa: 101.325,
		people: 'Demo Process Engineer',
		notes: 'Demo run, invented data.'
	});
	const read = readPointObjects(demoPoints(), 0);
	if (!read.ok) throw new Error(`The demo run's data are invalid: ${read.problems[0].message}`);
	storePoints(actor, created.id, read.batch, { source: 'csv', fileName: 'demo-run.csv' });
	return 1;
}

export function seedDemoRuns(): number {
	const engineer = findUserByEmail('engineer@demo.test');
	if (!engineer) return 0;
	const actor = { id: engineer.id, email: engineer.email };
	return seedKlaMap(engineer.id) + seedRun(actor);
}

import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { auditEventsFor } from '$lib/server/audit';
import { db } from '$lib/server/db';
import { organismProfile, run, study, vessel, vesselKlaPoint } from '$lib/server/db/schema';
import { DEMO_VESSELS } from '$lib/server/demo/studies';
import { readPointObjects } from '$lib/server/runs/read-points';
import { saveLearnedValues } from '$lib/server/runs/learn-profile';
import { createRun } from '$lib/server/runs/run-store';
import { storePoints } from '$lib/server/runs/store-points';
import { evaluateStudy } from '$lib/server/studies/evaluate';
import { loadStudyInputs } from '$lib/server/studies/queries';
import { saveVessel } from '$lib/server/studies/vessel-store';
import {
	klaMeasureSchema,
	measureKla,
	removeKlaPoint,
	saveKlaPoint
} from '$lib/server/vessels/kla-measure';
import { toStudyVessel } from '$lib/server/vessels/kla-map';
import { makeUser, refusalOf } from './helpers';
import { useDemoDatabase } from './demo-database';

useDemoDatabase();

const BENCH_VESSEL = 'Bench stirred tank BST-10';
const YEAST_STUDY = 'Yeast glycerol fed-batch, bench (demo)';

let actor: { id: string; email: string };

beforeAll(async () => {
	const person = await makeUser(['engineer']);
	actor = { id: person.id, email: person.email };
});

const vesselNamed = (name: string) => db.select().from(vessel).where(eq(vessel.name, name)).get()!;

/** Re-aeration after gassing out: C = 100 − 98·e^(−0.04·t) % of saturation, every 2 s to 150 s. */
const GASSING_OUT_KLA_PER_S = 0.04;
function gassingOutCsv(): string {
	const lines = ['time_s,do_percent'];
	for (let t = 0; t <= 150; t += 2)
		lines.push(`${t},${(100 - 98 * Math.exp(-GASSING_OUT_KLA_PER_S * t)).toFixed(4)}`);
	return lines.join('\n');
}

function klaForm(fields: Record<string, string>) {
	return klaMeasureSchema.parse({
		method: 'gassingOut',
		readings: gassingOutCsv(),
		measuredOn: '2026-12-01',
		agitationRpm: '600',
		gasFlowLPerMin: '6',
		liquidVolumeL: '8',
		temperatureC: '30',
		...fields
	});
}

describe('a kLa measured by gassing-out and saved to the vessel', () => {
	it('fits kLa 0.04 1/s = 144 1/h with a 95 % interval around it', () => {
		const measured = measureKla(vesselNamed(BENCH_VESSEL), klaForm({}));
		const expectedPerH = GASSING_OUT_KLA_PER_S * 3600;
		expect(Math.abs(measured.kLaPerH - expectedPerH) / expectedPerH).toBeLessThan(0.005);
		expect(measured.kLaLowPerH!).toBeLessThanOrEqual(expectedPerH);
		expect(measured.kLaHighPerH!).toBeGreaterThanOrEqual(expectedPerH);
	});

	it('saves the point with P/V and v_s worked from the vessel geometry, and audits it', () => {
		const row = vesselNamed(BENCH_VESSEL);
		const { id } = saveKlaPoint(actor, row.id, klaForm({}));
		const saved = db.select().from(vesselKlaPoint).where(eq(vesselKlaPoint.id, id)).get()!;

		// P = n·Np·ρ·N³·D⁵ (ungassed impeller power; Np 5 for a Rushton turbine, common practice),
		// ρ of water 1000 kg/m³, N in 1/s; V in m³.
		const powerNumber = row.powerNumber ?? 5;
		const speedPerS = 600 / 60;
		const powerW =
			row.impellerCount * powerNumber * 1000 * speedPerS ** 3 * row.impellerDiameterM! ** 5;
		expect(saved.powerPerVolumeWPerM3).toBeCloseTo(powerW / (8 / 1000), 6);
		// v_s = Q / (π·T²/4), Q in m³/s
		const crossSectionM2 = (Math.PI * row.vesselDiameterM! ** 2) / 4;
		expect(saved.superficialVelocityMPerS).toBeCloseTo(6 / 1000 / 60 / crossSectionM2, 12);
		expect(saved.powerSource).toBe('powerNumber');
		expect(saved.kLaPerH).toBeCloseTo(144, 0);

		const audit = auditEventsFor('vessel', row.id).find(
			(e) => e.action === 'vessel.kla_point_added'
		);
		expect(audit?.detail).toMatchObject({ pointId: id, method: 'gassingOut', agitationRpm: 600 });
	});

	const refusedReadings: [string, string, RegExp][] = [
		[
			'two DO columns',
			'time_s,do_percent,do_mg_per_l\n0,2,0.2\n2,10,0.8\n4,18,1.4',
			/one DO column/
		],
		['a pH column', 'time_s,do_percent,ph\n0,2,7\n2,10,7\n4,18,7', /ph is not read here/],
		['nothing', '', /Paste the DO readings/]
	];
	for (const [what, readings, says] of refusedReadings)
		it(`refuses readings with ${what} at the readings field`, async () => {
			const refusal = await refusalOf(() =>
				measureKla(vesselNamed(BENCH_VESSEL), klaForm({ readings }))
			);
			expect(refusal.field).toBe('readings');
			expect(refusal.message).toMatch(says);
		});

	it('refuses the dynamic method without the time the air came back on, at gasOnS', async () => {
		const refusal = await refusalOf(() =>
			measureKla(vesselNamed(BENCH_VESSEL), klaForm({ method: 'dynamic' }))
		);
		expect(refusal.field).toBe('gasOnS');
	});

	it('refuses a vessel without its geometry, naming the vessel diameter, and saves nothing', async () => {
		const id = saveVessel(actor, null, null, {
			...DEMO_VESSELS[0],
			name: 'Tank without geometry',
			vesselDiameterM: null,
			impellerDiameterM: null
		});
		const refusal = await refusalOf(() => saveKlaPoint(actor, id, klaForm({})));
		expect(refusal.message).toMatch(/vessel inner diameter/);
		expect(db.select().from(vesselKlaPoint).where(eq(vesselKlaPoint.vesselId, id)).all()).toEqual(
			[]
		);
	});
});

describe("the vessel's kLa map in a study", () => {
	it('gives a map once three points are measured, not before', () => {
		const id = saveVessel(actor, null, null, { ...DEMO_VESSELS[0], name: 'Map tank MT-3' });
		const mapOf = () => toStudyVessel(db.select().from(vessel).where(eq(vessel.id, id)).get()!);
		expect(mapOf().klaMap).toBeNull();
		// [rpm, L/min, kLa 1/h]: spread over both P/V and v_s so the correlation can be fitted
		const points: [string, string, string][] = [
			['400', '4', '80'],
			['800', '6', '260'],
			['600', '12', '230']
		];
		points.forEach(([agitationRpm, gasFlowLPerMin, enteredKLaPerH], i) => {
			if (i === 2) expect(mapOf().klaMap).toBeNull();
			saveKlaPoint(
				actor,
				id,
				klaForm({ method: 'entered', agitationRpm, gasFlowLPerMin, enteredKLaPerH })
			);
		});
		const map = mapOf().klaMap!;
		expect(map.pointCount).toBe(3);
		expect(map.geometry).toMatchObject({ vesselDiameterM: DEMO_VESSELS[0].vesselDiameterM });
		expect(map.plannedAgitationRpm).toBe(DEMO_VESSELS[0].plannedAgitationRpm);
	});

	it("reports the study's kLa as taken from the measured map when the vessel says so", async () => {
		const bench = vesselNamed(BENCH_VESSEL);
		const studyId = db.select().from(study).where(eq(study.name, YEAST_STUDY)).get()!.id;
		expect(toStudyVessel(bench).klaMap).not.toBeNull();

		const before = await evaluateStudy(loadStudyInputs(studyId).inputs);
		expect(before.defaults.find((d) => d.what === 'kLa')).toBeUndefined();

		db.update(vessel).set({ kLaMode: 'map' }).where(eq(vessel.id, bench.id)).run();
		const report = await evaluateStudy(loadStudyInputs(studyId).inputs);
		const kLa = report.defaults.find((d) => d.what === 'kLa');
		expect(kLa?.source).toMatch(/measured kLa map/);
		expect(kLa?.value).toMatch(/1\/h$/);
	});
});

describe('growth values learned from a run saved to its profile', () => {
	const MU_PER_H = 0.25;
	let runRow: typeof run.$inferSelect;
	const profileOf = () =>
		db.select().from(organismProfile).where(eq(organismProfile.id, runRow.profileId)).get()!;

	beforeAll(() => {
		const studyId = db.select().from(study).where(eq(study.name, YEAST_STUDY)).get()!.id;
		const { id } = createRun(actor, {
			name: 'Learning run',
			studyId,
			vesselId: '',
			profileId: '',
			startedAt: '2026-12-02T08:00',
			gasReferenceTemperatureC: 0,
			gasReferencePressureKPa: 101.325,
			people: '',
			notes: ''
		});
		// dry weight X = 0.3·e^(0.25·t) g/L, sampled hourly for 9 h: exponential growth at μ 0.25 1/h
		const samples = Array.from({ length: 10 }, (_, h) => ({
			time_h: h,
			dry_weight_g_per_l: Number((0.3 * Math.exp(MU_PER_H * h)).toFixed(5))
		}));
		const read = readPointObjects(samples, 0);
		if (!read.ok) throw new Error(JSON.stringify(read.problems));
		storePoints(actor, id, read.batch, { source: 'api' });
		runRow = db.select().from(run).where(eq(run.id, id)).get()!;
	});

	it('refuses a save without a field', async () => {
		const refusal = await refusalOf(() =>
			saveLearnedValues(actor, runRow, [], profileOf().revision)
		);
		expect(refusal.field).toBe('fields');
	});

	it('refuses Yx/O2 when the run has no gas data, changing nothing', async () => {
		const before = profileOf();
		const refusal = await refusalOf(() =>
			saveLearnedValues(actor, runRow, ['yieldXO2GPerG'], before.revision)
		);
		expect(refusal.message).toMatch(/Yx\/O2/);
		expect(profileOf()).toEqual(before);
	});

	it('saves μmax as the next revision, with a note and an audit row naming the run', async () => {
		const before = profileOf();
		const saved = await saveLearnedValues(actor, runRow, ['muMaxPerH'], before.revision);
		expect(saved).toEqual(['μmax']);
		const after = profileOf();
		expect(after.revision).toBe(before.revision + 1);
		expect(Math.abs(after.muMaxPerH! - MU_PER_H) / MU_PER_H).toBeLessThan(0.02);
		expect(after.notes.startsWith(before.notes)).toBe(true);
		expect(after.notes.slice(before.notes.length)).toContain(`fitted to run ${runRow.number}`);
		const audit = auditEventsFor('organism_profile', after.id).find(
			(e) => e.action === 'profile.learned_from_run'
		);
		expect(audit?.detail).toMatchObject({ runId: runRow.id, runNumber: runRow.number });
	});

	it('refuses a stale revision with 409 and changes nothing', async () => {
		const before = profileOf();
		const refusal = await refusalOf(() =>
			saveLearnedValues(actor, runRow, ['muMaxPerH'], before.revision - 1)
		);
		expect(refusal.status).toBe(409);
		expect(profileOf()).toEqual(before);
	});
});

describe('a wrong point taken off the map', () => {
	it('needs a reason, removes only this vessel’s point, and keeps it in the audit trail', async () => {
		const row = vesselNamed(BENCH_VESSEL);
		const { id } = saveKlaPoint(actor, row.id, klaForm({ agitationRpm: '650' }));
		expect((await refusalOf(() => removeKlaPoint(actor, row.id, id, '  '))).field).toBe('reason');
		const other = vesselNamed(DEMO_VESSELS[1].name);
		expect(
			(await refusalOf(() => removeKlaPoint(actor, other.id, id, 'wrong vessel'))).status
		).toBe(404);
		expect(db.select().from(vesselKlaPoint).where(eq(vesselKlaPoint.id, id)).get()).toBeDefined();

		removeKlaPoint(actor, row.id, id, 'probe not calibrated');
		expect(db.select().from(vesselKlaPoint).where(eq(vesselKlaPoint.id, id)).get()).toBeUndefined();
		const removed = auditEventsFor('vessel', row.id).find(
			(e) => e.action === 'vessel.kla_point_removed'
		)!;
		expect(removed.detail).toMatchObject({
			reason: 'probe not calibrated',
			point: { id, agitationRpm: 650 }
		});
	});
});

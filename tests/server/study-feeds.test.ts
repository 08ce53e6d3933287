import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { ATOMIC_WEIGHTS, formulaMolarMass } from '$chemistry';
import { db } from '$lib/server/db';
import { study } from '$lib/server/db/schema';
import { RuleError } from '$lib/server/rule-error';
import { evaluateStudy } from '$lib/server/studies/evaluate';
import { loadStudyInputs } from '$lib/server/studies/queries';
import { parseForm } from '$lib/server/forms';
import { studySchema, type StudyForm } from '$lib/server/studies/study-form';
import { createStudy, studyFormValues } from '$lib/server/studies/study-store';
import type { StudyInputs } from '$lib/server/studies/types';
import { useDemoDatabase } from './demo-database';

useDemoDatabase();

const TWO_FEEDS = 'Yeast DO-stat with nitrogen top-up, bench (demo)';
const PILOT = 'Bacterium glucose fed-batch, pilot (demo)';
const studyId = (name: string) => db.select().from(study).where(eq(study.name, name)).get()!.id;

let engineer: { id: string; email: string };
beforeAll(async () => {
	engineer = { id: db.select().from(study).get()!.createdById, email: 'engineer@demo.test' };
});

/** The two-feed demo study with its plans changed. */
function withFeeds(change: (feeds: StudyInputs['feeds']) => void): StudyInputs {
	const { inputs } = loadStudyInputs(studyId(TWO_FEEDS));
	const copy = structuredClone(inputs);
	change(copy.feeds);
	return copy;
}

function formOf(name: string, overrides: Record<string, string | number | null>): StudyForm {
	const values = studyFormValues(studyId(TWO_FEEDS))!;
	const numeric = new Set([
		'targetValue',
		'initialVolumeL',
		'inoculumDensity',
		'durationH',
		'temperatureC',
		'pressureKPa',
		'o2MoleFraction',
		'doSetpointPercent',
		'safetyFactor'
	]);
	const form: Record<string, string | number | null> = {};
	for (const [k, v] of Object.entries(values)) {
		if (k === 'revision') continue;
		form[k] =
			numeric.has(k) ||
			/^feed\d(VolumeL|StartH|MuSetPerH|SetpointGPerL|DoSetpointPercent|MaxRateLPerH)$/.test(k)
				? v === ''
					? null
					: Number(v)
				: v || null;
	}
	return { ...form, notes: '', name, ...overrides } as unknown as StudyForm;
}

describe('feeds with their own plans', () => {
	it('runs a DO-stat glycerol feed and a constant nitrogen top-up side by side', async () => {
		const report = await evaluateStudy(loadStudyInputs(studyId(TWO_FEEDS)).inputs);
		expect(report.feeds.map((f) => [f.strategy, f.controlled])).toEqual([
			['doStat', true],
			['constant', false]
		]);
		const [glycerol, topUp] = report.feeds;
		// An open plan delivers its planned volume between its start and the end of the run (the rate is V/(t_end − t_start)).
		expect(topUp.deliveredL).toBeCloseTo(0.4, 6);
		expect(topUp.usedL).toBe(0.4);
		// A controlled plan counts what the run drew, at most what is available; never more than the pump's
		// top rate over the feeding time, 0.08 L/h × (60 − 24) h = 2.88 L.
		expect(glycerol.deliveredL).toBeGreaterThan(0);
		expect(glycerol.deliveredL!).toBeLessThanOrEqual(0.08 * 36 * (1 + 1e-9));
		expect(glycerol.usedL).toBeCloseTo(Math.min(glycerol.deliveredL!, 3), 9);
		// Volume balance: final = initial + every feed counted.
		expect(report.volume.finalL).toBeCloseTo(5 + glycerol.usedL + topUp.usedL, 9);
		const course = report.timeCourse;
		if (course.check === 'unavailable') throw new Error(course.message);
		expect(course.volumeL.at(-1)).toBeCloseTo(5 + glycerol.deliveredL! + topUp.deliveredL!, 6);
		expect(course.events.filter((e) => e.kind === 'feedStarted')).toHaveLength(2);
	});

	it('counts both feeds in the nitrogen supply, worked by hand', async () => {
		const report = await evaluateStudy(loadStudyInputs(studyId(TWO_FEEDS)).inputs);
		// (NH4)2SO4 is 2 N per formula unit (IUPAC 2021 weights): basal 5 g/L × 5 L, the glycerol feed 70 g/L × what
		// the run drew, the top-up 200 g/L × 0.4 L; over the final volume.
		const nPerSulfate = (2 * ATOMIC_WEIGHTS.N) / formulaMolarMass('(NH4)2SO4');
		const n = report.nutrients.lines.find((l) => l.key === 'N')!;
		const drawn = report.feeds[0].usedL;
		expect(n.supplyGPerL).toBeCloseTo(
			((5 * 5 + 70 * drawn + 200 * 0.4) * nPerSulfate) / report.volume.finalL,
			4
		);
	});

	it('tells a shortfall the feeds make good from one that lasts', async () => {
		const report = await evaluateStudy(loadStudyInputs(studyId(TWO_FEEDS)).inputs);
		// The basal nitrogen is used up in the batch phase, before both feeds start at 24 h; they then cover it.
		const n = report.nutrients.lines.find((l) => l.key === 'N')!;
		expect(n.runout!.shortFromH).toBeLessThan(24);
		expect(n.runout!.coveredAgainH!).toBeGreaterThan(24);
		expect(report.warnings.join(' ')).toMatch(
			/N is used up at about \d+ h and covered again from about \d+ h/
		);
		// Without the feeds it stays short.
		const batch = structuredClone(loadStudyInputs(studyId(TWO_FEEDS)).inputs);
		batch.feeds = [];
		const unfed = (await evaluateStudy(batch)).nutrients.lines.find((l) => l.key === 'N')!;
		expect(unfed.runout!.coveredAgainH).toBeNull();
		expect(unfed.runout!.shortFromH).toBeCloseTo(n.runout!.shortFromH, 6);
	});

	it('says when a controlled feed would run dry, and counts only what is available', async () => {
		const inputs = withFeeds((feeds) => (feeds[0].volumeL = 0.8));
		const report = await evaluateStudy(inputs);
		const glycerol = report.feeds[0];
		// At most 0.08 L/h from 24 h, 0.8 L lasts at least until 34 h.
		expect(glycerol.emptyAtH!).toBeGreaterThanOrEqual(34 - 0.05);
		expect(glycerol.deliveredL!).toBeGreaterThan(0.8);
		expect(glycerol.usedL).toBe(0.8);
		expect(report.verdict).toBe('not supported');
		expect(report.reasons.join(' ')).toMatch(
			/runs dry at about \d+ h: its plan would draw [\d.]+ L, but 0.8 L are available/
		);
	});

	it('finds when a nutrient runs out along a batch run, as the crossing of X with target × ratio', async () => {
		// Without feeds the supply is fixed: a line of ratio ρ runs out when X·V·(demand/X_target) = supply·V,
		// i.e. when X reaches X_target·ρ (mass balance). Found here independently from the biomass curves:
		// the limiting required line on the run's growth on glucose alone, every other line on the course
		// held to that line (law of the minimum), which it may never reach.
		const { inputs } = loadStudyInputs(studyId(PILOT));
		const batch = structuredClone(inputs);
		batch.feeds = [];
		const report = await evaluateStudy(batch);
		const course = report.timeCourse;
		if (course.check === 'unavailable') throw new Error(course.message);
		const short = report.nutrients.lines.filter((l) => l.ratio < 1 && l.key !== 'd-glucose');
		expect(short.length).toBeGreaterThan(0);
		const holding = course.nutrientHold!.nutrient;
		expect(holding).toBe(report.limit.name);
		let crossings = 0;
		for (const line of short) {
			const level = report.inputs.targetBiomassGPerL * line.ratio;
			const biomass =
				line.name === holding ? course.nutrientHold!.carbonOnlyBiomassGPerL : course.biomassGPerL;
			const i = biomass.findIndex((x) => x >= level);
			if (i < 0) {
				expect(line.runout).toBeNull();
				continue;
			}
			// Without feeds nothing covers it again.
			expect(line.runout!.coveredAgainH).toBeNull();
			if (i === 0) {
				// Short even for the inoculum: out from the start.
				expect(line.runout!.shortFromH).toBe(course.t[0]);
				continue;
			}
			crossings++;
			const [t0, t1, x0, x1] = [course.t[i - 1], course.t[i], biomass[i - 1], biomass[i]];
			expect(line.runout!.shortFromH).toBeCloseTo(t0 + ((t1 - t0) * (level - x0)) / (x1 - x0), 6);
		}
		expect(crossings).toBeGreaterThan(0);
		expect(report.nutrients.lines.find((l) => l.key === 'd-glucose')?.runout ?? null).toBeNull();
		// Held, the batch ends at what the limiting line's supply carries: X_target·ρ.
		expect(course.finalBiomassGPerL).toBeCloseTo(
			report.inputs.targetBiomassGPerL * report.limit.ratio,
			6
		);
	});

	it('saves the plans and refills the form with them', () => {
		const values = studyFormValues(studyId(TWO_FEEDS))!;
		expect(values.feed1Strategy).toBe('doStat');
		expect(values.feed1DoSetpointPercent).toBe('35');
		expect(values.feed1MaxRateLPerH).toBe('0.08');
		expect(values.feed2Strategy).toBe('constant');
		expect(values.feed2StartH).toBe('24');
	});
});

describe('bad feed plans', () => {
	const refused = async (overrides: Record<string, string | number | null>) => {
		try {
			await createStudy(engineer, formOf(`Refused ${crypto.randomUUID().slice(0, 6)}`, overrides));
		} catch (cause) {
			if (cause instanceof RuleError) return cause;
			throw cause;
		}
		throw new Error('saved, but should have been refused');
	};

	it('asks for what each plan needs, naming the field', async () => {
		expect((await refused({ feed1MaxRateLPerH: null })).field).toBe('feed1MaxRateLPerH');
		expect((await refused({ feed1DoSetpointPercent: null })).field).toBe('feed1DoSetpointPercent');
		expect((await refused({ feed2Strategy: 'exponential' })).field).toBe('feed2MuSetPerH');
		expect((await refused({ feed2Strategy: 'substrateStat', feed2MaxRateLPerH: 0.1 })).field).toBe(
			'feed2SetpointGPerL'
		);
		expect((await refused({ feed2Strategy: null })).field).toBe('feed2Strategy');
		expect((await refused({ feed2StartH: 70 })).message).toMatch(
			/must start before the end of the run at 60 h/
		);
	});

	it('lists every problem of one save at once: a field, and each feed slot’s missing values', () => {
		const formData = new FormData();
		for (const [key, value] of Object.entries(studyFormValues(studyId(TWO_FEEDS))!))
			formData.set(key, value);
		formData.set('durationH', 'two days');
		formData.set('feed1MaxRateLPerH', '');
		formData.set('feed2Strategy', 'exponential');
		formData.set('feed2StartH', '');
		const parsed = parseForm(studySchema, formData);
		expect(parsed.ok).toBe(false);
		if (parsed.ok) return;
		const { fieldErrors, values } = parsed.failure.data;
		expect(fieldErrors).toEqual({
			durationH: ['Run duration: “two days” is not a number.'],
			feed1MaxRateLPerH: ["A DO-stat plan needs the pump's top rate, L/h."],
			feed2StartH: ['Enter when feed 2 starts, h after inoculation.'],
			feed2MuSetPerH: ['An exponential plan needs μset, the growth rate it is shaped for.']
		});
		expect(values.durationH).toBe('two days');
	});

	it('refuses a substrate-stat plan on a feed that carries no carbon source', async () => {
		const e = await refused({
			feed2Strategy: 'substrateStat',
			feed2SetpointGPerL: 0.5,
			feed2MaxRateLPerH: 0.1
		});
		expect(e.field).toBe('feed2Strategy');
		expect(e.message).toMatch(
			/PPN Nitrogen Top-up N2 v1 carries no Glycerol, so a substrate-stat plan cannot hold Glycerol at its setpoint/
		);
		const high = await refused({
			feed1Strategy: 'substrateStat',
			feed1SetpointGPerL: 600,
			feed1MaxRateLPerH: 0.1
		});
		expect(high.field).toBe('feed1Strategy');
		expect(high.message).toMatch(/not more than the setpoint of 600 g\/L/);
	});
});

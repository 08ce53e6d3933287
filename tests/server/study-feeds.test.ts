import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { ATOMIC_WEIGHTS, formulaMolarMass } from '$chemistry';
import { db } from '$lib/server/db';
import { study } from '$lib/server/db/schema';
import { seedDemo } from '$lib/server/demo/seed';
import { RuleError } from '$lib/server/rule-error';
import { evaluateStudy } from '$lib/server/studies/evaluate';
import { loadStudyInputs } from '$lib/server/studies/queries';
import { createStudy, studyFormValues, type StudyForm } from '$lib/server/studies/study-store';
import type { StudyInputs } from '$lib/server/studies/types';

const TWO_FEEDS = 'Bacterium DO-stat with salts feed, bench (demo)';
const PILOT = 'Bacterium glucose fed-batch, pilot (demo)';
const studyId = (name: string) => db.select().from(study).where(eq(study.name, name)).get()!.id;

let engineer: { id: string; email: string };
beforeAll(async () => {
	await seedDemo();
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
	const numeric = new Set(['targetValue', 'initialVolumeL', 'inoculumDensity', 'durationH', 'temperatureC', 'pressureKPa', 'o2MoleFraction', 'doSetpointPercent', 'safetyFactor']);
	const form: Record<string, string | number | null> = {};
	for (const [k, v] of Object.entries(values)) {
		if (k === 'revision') continue;
		form[k] = numeric.has(k) || /^feed\d(VolumeL|StartH|MuSetPerH|SetpointGPerL|DoSetpointPercent|MaxRateLPerH)$/.test(k) ? (v === '' ? null : Number(v)) : v || null;
	}
	return { ...form, notes: '', name, ...overrides } as unknown as StudyForm;
}

describe('feeds with their own plans', () => {
	it('runs a DO-stat glucose feed and a constant salts feed side by side', () => {
		const report = evaluateStudy(loadStudyInputs(studyId(TWO_FEEDS)).inputs);
		expect(report.feeds.map((f) => [f.strategy, f.controlled])).toEqual([
			['doStat', true],
			['constant', false]
		]);
		const [glucose, salts] = report.feeds;
		// An open plan delivers its planned volume between its start and the end of the run (the rate is V/(t_end − t_start)).
		expect(salts.deliveredL).toBeCloseTo(0.4, 6);
		expect(salts.usedL).toBe(0.4);
		// A controlled plan counts what the run drew, at most what is available.
		expect(glucose.deliveredL).toBeGreaterThan(0);
		expect(glucose.usedL).toBeCloseTo(Math.min(glucose.deliveredL!, 1.5), 9);
		// Volume balance: final = initial + every feed counted.
		expect(report.volume.finalL).toBeCloseTo(5 + glucose.usedL + salts.usedL, 9);
		const course = report.timeCourse;
		if (course.check === 'unavailable') throw new Error(course.message);
		expect(course.volumeL.at(-1)).toBeCloseTo(5 + glucose.deliveredL! + salts.deliveredL!, 6);
		expect(course.events.filter((e) => e.kind === 'feedStarted')).toHaveLength(2);
	});

	it('counts the salts feed in the nitrogen supply, worked by hand', () => {
		const report = evaluateStudy(loadStudyInputs(studyId(TWO_FEEDS)).inputs);
		// (NH4)2SO4 is 2 N per formula unit (IUPAC 2021 weights): basal 2.4 g/L × 5 L + salts feed 150 g/L × 0.4 L;
		// the glucose feed carries no nitrogen. Over the final volume.
		const nPerSulfate = (2 * ATOMIC_WEIGHTS.N) / formulaMolarMass('(NH4)2SO4');
		const n = report.nutrients.lines.find((l) => l.key === 'N')!;
		expect(n.supplyGPerL).toBeCloseTo(((2.4 * 5 + 150 * 0.4) * nPerSulfate) / report.volume.finalL, 6);
	});

	it('says when a controlled feed would run dry, and counts only what is available', () => {
		const inputs = withFeeds((feeds) => (feeds[0].volumeL = 0.05));
		const report = evaluateStudy(inputs);
		const glucose = report.feeds[0];
		expect(glucose.emptyAtH).not.toBeNull();
		expect(glucose.deliveredL!).toBeGreaterThan(0.05);
		expect(glucose.usedL).toBe(0.05);
		expect(report.verdict).toBe('not supported');
		expect(report.reasons.join(' ')).toMatch(/runs dry at about \d+ h: its plan would draw [\d.]+ L, but 0.05 L are available/);
	});

	it('finds when a nutrient runs out along a batch run, as the crossing of X with target × ratio', () => {
		// Without feeds the supply is fixed: a line of ratio ρ runs out when X·V·(demand/X_target) = supply·V,
		// i.e. when X reaches X_target·ρ (mass balance). Found here independently from the biomass curve.
		const { inputs } = loadStudyInputs(studyId(PILOT));
		const batch = structuredClone(inputs);
		batch.feeds = [];
		const report = evaluateStudy(batch);
		const course = report.timeCourse;
		if (course.check === 'unavailable') throw new Error(course.message);
		const short = report.nutrients.lines.filter((l) => l.ratio < 1 && l.key !== 'd-glucose');
		expect(short.length).toBeGreaterThan(0);
		for (const line of short) {
			const level = report.inputs.targetBiomassGPerL * line.ratio;
			const i = course.biomassGPerL.findIndex((x) => x >= level);
			if (i < 0) {
				expect(line.runsOutAtH).toBeNull();
				continue;
			}
			const [t0, t1, x0, x1] = [course.t[i - 1], course.t[i], course.biomassGPerL[i - 1], course.biomassGPerL[i]];
			expect(line.runsOutAtH!).toBeCloseTo(t0 + ((t1 - t0) * (level - x0)) / (x1 - x0), 6);
		}
		expect(report.nutrients.lines.find((l) => l.key === 'd-glucose')?.runsOutAtH ?? null).toBeNull();
	});

	it('saves the plans and refills the form with them', () => {
		const values = studyFormValues(studyId(TWO_FEEDS))!;
		expect(values.feed1Strategy).toBe('doStat');
		expect(values.feed1DoSetpointPercent).toBe('40');
		expect(values.feed1MaxRateLPerH).toBe('0.15');
		expect(values.feed2Strategy).toBe('constant');
		expect(values.feed2StartH).toBe('8');
	});
});

describe('bad feed plans', () => {
	const refused = (overrides: Record<string, string | number | null>) => {
		try {
			createStudy(engineer, formOf(`Refused ${crypto.randomUUID().slice(0, 6)}`, overrides));
		} catch (cause) {
			if (cause instanceof RuleError) return cause;
			throw cause;
		}
		throw new Error('saved, but should have been refused');
	};

	it('asks for what each plan needs, naming the field', () => {
		expect(refused({ feed1MaxRateLPerH: null }).field).toBe('feed1MaxRateLPerH');
		expect(refused({ feed1DoSetpointPercent: null }).field).toBe('feed1DoSetpointPercent');
		expect(refused({ feed2Strategy: 'exponential' }).field).toBe('feed2MuSetPerH');
		expect(refused({ feed2Strategy: 'substrateStat', feed2MaxRateLPerH: 0.1 }).field).toBe('feed2SetpointGPerL');
		expect(refused({ feed2Strategy: null }).field).toBe('feed2Strategy');
		expect(refused({ feed2StartH: 30 }).message).toMatch(/must start before the end of the run at 24 h/);
	});

	it('refuses a substrate-stat plan on a feed that carries no carbon source', () => {
		const e = refused({ feed2Strategy: 'substrateStat', feed2SetpointGPerL: 0.5, feed2MaxRateLPerH: 0.1 });
		expect(e.field).toBe('feed2Strategy');
		expect(e.message).toMatch(/substrate- or DO-stat feed/);
	});
});

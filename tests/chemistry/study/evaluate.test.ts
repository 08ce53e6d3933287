import { describe, expect, it } from 'vitest';
import { ChemistryInputError, StudyDataError, evaluateStudy, type StudyReport } from '$chemistry';
import { errorOf } from '../input-error';
import { GLUCOSE, constantPlan, feedOf, profileOf, studyOf, vesselOf } from './fixture';

// O2 = 2 × 15.999 g/mol (IUPAC 2021 atomic weights, chemistry/REFERENCES.md).
const O2_G_PER_MOL = 31.998;

function courseOf(report: StudyReport) {
	if (report.timeCourse.check === 'unavailable')
		throw new Error(`no time course: ${report.timeCourse.message}`);
	return report.timeCourse;
}

describe('the nutrient table of a study, worked by hand', () => {
	it('sets each demand to X·w (elements) or X/Yx/s (the carbon source), and the limit at supply/(w·safety factor)', () => {
		const report = evaluateStudy(studyOf());
		const line = (key: string) => report.nutrients.lines.find((l) => l.key === key)!;
		// N: 5 g/L × 0.14 = 0.7 g/L demand; 1.5 g/L supplied → ratio 1.5/0.7; at most 1.5/(0.14 × 1.2) g/L.
		expect(line('N').demandGPerL).toBeCloseTo(0.7, 12);
		expect(line('N').ratio).toBeCloseTo(1.5 / 0.7, 12);
		expect(line('N').maxBiomassGPerL).toBeCloseTo(1.5 / (0.14 * 1.2), 12);
		// Glucose: 5 g/L / 0.5 g/g = 10 g/L demand; 20 g/L supplied → ratio 2, at most 20 × 0.5/1.2 g/L; it limits first.
		expect(line(GLUCOSE).demandGPerL).toBeCloseTo(10, 12);
		expect(report.limit).toMatchObject({ key: GLUCOSE, name: 'D-glucose', basis: 'component' });
		expect(report.limit.maxBiomassGPerL).toBeCloseTo((20 * 0.5) / 1.2, 12);
		expect(report.nutrients.check).toBe('ok');
		expect(report.defaults).toContainEqual({
			what: 'Safety factor',
			value: '1.2',
			source: 'Common practice (the study keeps the suggested value)'
		});
	});

	it('finds nitrogen short, and when it runs out: where X·0.14 reaches the 0.35 g/L supplied (X = 2.5 g/L)', () => {
		const study = studyOf();
		study.basal.composition.elementsGPerL.N = 0.35;
		const report = evaluateStudy(study, { kLaPerH: 2000 });
		// 0.35 / (0.14 × 1.2) = 2.083 g/L.
		expect(report.reasons).toContain(
			'N runs short of 1.2 × demand; N limits first, at about 2.08 g/L.'
		);
		const course = courseOf(report);
		// Independent of the code under test: the crossing of X = 0.35/0.14 in the run's own biomass
		// series on glucose alone (before any nutrient holds it).
		const carbonOnly = course.nutrientHold!.carbonOnlyBiomassGPerL;
		const i = carbonOnly.findIndex((x) => x >= 0.35 / 0.14);
		const [x0, x1] = [carbonOnly[i - 1], carbonOnly[i]];
		const crossingH = course.t[i - 1] + ((course.t[i] - course.t[i - 1]) * (2.5 - x0)) / (x1 - x0);
		const runout = report.nutrients.lines.find((l) => l.key === 'N')!.runout!;
		expect(runout.shortFromH).toBeCloseTo(crossingH, 6);
		expect(runout.coveredAgainH).toBeNull();
		expect(report.notes).toContain(
			`N runs out at about ${crossingH.toFixed(0)} h and stays short: from there growth is held to what N arrives, as the time course shows.`
		);
		// The course shown is held there (law of the minimum): in this batch at constant volume the
		// 0.35 g/L N supplied carries 0.35 / 0.14 = 2.5 g/L biomass and no more.
		expect(course.nutrientHold).toMatchObject({ nutrient: 'N' });
		expect(course.nutrientHold!.fromH).toBeCloseTo(crossingH, 6);
		expect(Math.max(...course.biomassGPerL)).toBeCloseTo(2.5, 9);
		expect(course.finalBiomassGPerL).toBeCloseTo(2.5, 9);
		expect(course.nutrientHold!.allowedGPerL.at(-1)).toBeCloseTo(2.5, 9);
		expect(Math.max(...carbonOnly)).toBeGreaterThan(5);
		expect(course.check).toBe('short');
		// The shortfall is said once, as the nutrient's; the course adds no second reason for it.
		expect(report.reasons.filter((r) => r.includes('N '))).toHaveLength(1);
	});

	it('turns a cells/mL target into g/L with the cell dry mass: 2e7 cells/mL × 250 pg = 5 g/L', () => {
		const study = studyOf({ profile: profileOf({ cellDryMassPg: 250 }) });
		study.plan.targetBasis = 'cellsPerMl';
		study.plan.targetValue = 2e7;
		study.plan.inoculumDensity = 4e5;
		const report = evaluateStudy(study);
		// 1 cell/mL × 1 pg = 1e3 cells/L × 1e-12 g = 1e-9 g/L (SI prefixes).
		expect(report.inputs.targetBiomassGPerL).toBeCloseTo(5, 12);
		expect(report.inputs.targetCellsPerMl).toBe(2e7);
		expect(report.limit.maxCellsPerMl).toBeCloseTo((2e7 * report.limit.ratio) / 1.2, 0);
		// The inoculum, 4e5 cells/mL × 250 pg = 0.1 g/L, is where the time course starts.
		expect(courseOf(report).biomassGPerL[0]).toBeCloseTo(0.1, 12);
	});
});

describe('oxygen and heat of a study', () => {
	it('takes OUR = 1000·μ·X/(Yx/O2·M_O2) with Monod μ along the run, and its peak up to the target', () => {
		const report = evaluateStudy(studyOf(), { kLaPerH: 2000 });
		const course = courseOf(report);
		expect(course.oxygenLimitedH).toEqual([]);
		// Monod (1949) with μmax 0.5 /h, Ks 0.1 g/L; Yx/O2 0.721 g/g.
		course.t.forEach((_, i) => {
			const s = Math.max(0, course.substrateGPerL[i]);
			const mu = (0.5 * s) / (0.1 + s);
			expect(course.ourMmolPerLH[i]).toBeCloseTo(
				(1000 * mu * course.biomassGPerL[i]) / (0.721 * O2_G_PER_MOL),
				6
			);
		});
		const untilTarget = course.ourMmolPerLH.filter(
			(_, i) => course.t[i] <= course.targetReachedAtH!
		);
		expect(report.oxygen.peakOurMmolPerLH).toBeGreaterThanOrEqual(Math.max(...untilTarget) - 1e-9);
		expect(report.oxygen.peakOurMmolPerLH).toBeLessThanOrEqual(
			Math.max(...course.ourMmolPerLH) + 1e-9
		);
	});

	it('sets the maximum OTR at kLa·(C* − C_set) with C* 6.727 mg/L at 37 °C, and the kLa needed from it', () => {
		const report = evaluateStudy(studyOf());
		// Benson & Krause (1984) at 37 °C, air, 1 atm: 6.727 mg/L (chemistry/REFERENCES.md); setpoint 30 %.
		expect(report.oxygen.saturationMgPerL).toBeCloseTo(6.727, 3);
		const drivingMgPerL = report.oxygen.saturationMgPerL * 0.7;
		expect(report.oxygen.maxOtrMmolPerLH).toBeCloseTo((300 * drivingMgPerL) / O2_G_PER_MOL, 6);
		expect(report.oxygen.kLaNeededPerH).toBeCloseTo(
			(report.oxygen.peakOurMmolPerLH * O2_G_PER_MOL) / drivingMgPerL,
			6
		);
		expect(report.oxygen.kLaRecommendedPerH).toBeGreaterThanOrEqual(report.oxygen.kLaNeededPerH);
		expect(report.oxygen.check).toBe('short');
		expect(report.reasons[0]).toMatch(
			/^Peak OUR \d+ mmol\/\(L·h\) exceeds the maximum OTR \d+ mmol\/\(L·h\) at the DO setpoint: the plan needs kLa \d+ 1\/h \(this vessel does not allow O2 enrichment\)\.$/
		);
	});

	it('takes the heat load as OUR·V·440 kJ/mol / 3600 s/h plus the agitator', () => {
		const report = evaluateStudy(studyOf());
		// 440 kJ per mol O2 (Birou, Marison & von Stockar 1987, chemistry/REFERENCES.md); batch volume 5 L; agitator 50 W.
		expect(report.heat.metabolicW).toBeCloseTo(
			(report.oxygen.peakOurMmolPerLH * 5 * 440) / 3600,
			6
		);
		expect(report.heat.heatLoadW).toBeCloseTo(report.heat.metabolicW + 50, 9);
		expect(report.heat.utilisation).toBeCloseTo(report.heat.heatLoadW / 2000, 12);
	});

	it('names a sparge above air in a vessel that does not allow enrichment', () => {
		const report = evaluateStudy(studyOf(), { o2MoleFraction: 0.4 });
		expect(report.reasons).toContain(
			'The plan sparges 40 % O2, but the vessel “Test vessel” does not allow O2 enrichment.'
		);
		expect(report.oxygen.check).toBe('short');
	});
});

describe('feeds and volume', () => {
	it("delivers an open plan's volume, constant, linear or exponential (F0 = Vμ/(e^{μΔt} − 1)), between its start and the end", () => {
		for (const strategy of ['constant', 'linear', 'exponential'] as const) {
			const plan = {
				...constantPlan(4),
				strategy,
				muSetPerH: strategy === 'exponential' ? 0.1 : null
			};
			const report = evaluateStudy(studyOf({ feeds: [feedOf(2, plan)] }), { kLaPerH: 2000 });
			// ∫ F dt over [4 h, 24 h] is the planned 2 L whatever the shape; the final volume is 5 + 2 L.
			expect(report.feeds[0].deliveredL).toBeCloseTo(2, 4);
			expect(report.volume.finalL).toBe(7);
			const course = courseOf(report);
			expect(course.volumeL[course.volumeL.length - 1]).toBeCloseTo(7, 4);
			// Nothing before the start at 4 h.
			expect(course.volumeL[course.t.findLastIndex((t) => t <= 4)]).toBeCloseTo(5, 9);
		}
	});

	it('scales every feed to the what-if volume and refuses one to scale when there is none', () => {
		const report = evaluateStudy(studyOf({ feeds: [feedOf(2, constantPlan(4))] }), {
			feedVolumeL: 3
		});
		expect(report.feeds[0].volumeL).toBe(3);
		expect(report.volume.finalL).toBe(8);
		const none = errorOf(() => evaluateStudy(studyOf(), { feedVolumeL: 1 }));
		expect(none.field).toBe('feedVolumeL');
		expect(none.message).toBe(
			'This study has no feed to scale: add a feed recipe version to the study first.'
		);
	});

	it("gives the vessel's working volume as reasons", () => {
		const study = studyOf();
		study.plan.initialVolumeL = 1;
		const report = evaluateStudy(study);
		expect(report.volume.check).toBe('short');
		expect(report.reasons).toContain(
			"Initial volume 1 L is below the vessel's minimum working volume of 2 L."
		);
		const full = evaluateStudy(studyOf({ feeds: [feedOf(6, constantPlan(4))] }));
		expect(full.reasons).toContain(
			"Final volume 11.0 L is above the vessel's maximum working volume of 10 L."
		);
	});
});

describe('bad input names its field', () => {
	it("a what-if out of range is the request's: ChemistryInputError, not StudyDataError", () => {
		const cases: [Parameters<typeof evaluateStudy>[1], string, string][] = [
			[{ targetValue: 0 }, 'targetValue', 'The target density must be greater than 0, not 0.'],
			[
				{ targetValue: 250 },
				'targetValue',
				'A target of 250 g/L dry biomass is beyond physical sense: above 200 g/L the broth would be packed cells.'
			],
			[{ kLaPerH: 4000 }, 'kLaPerH', 'kLa must be above 0 and at most 3600 1/h, not 4000.'],
			[
				{ o2MoleFraction: 1.5 },
				'o2MoleFraction',
				'The O2 mole fraction must be above 0 and at most 1, not 1.5.'
			],
			[
				{ temperatureC: 45 },
				'temperatureC',
				'The temperature must be between 0 and 40 °C for the oxygen solubility equations, not 45.'
			],
			[{ feedVolumeL: -1 }, 'feedVolumeL', 'The feed volume must be 0 or more litres, not -1.']
		];
		for (const [whatIf, field, message] of cases) {
			const error = errorOf(() => evaluateStudy(studyOf(), whatIf));
			expect(error).not.toBeInstanceOf(StudyDataError);
			expect({ field: error.field, message: error.message }).toEqual({ field, message });
		}
		const study = studyOf({ vessel: vesselOf({ maxPressureKPa: 150 }) });
		study.plan.pressureKPa = 180;
		expect(errorOf(() => evaluateStudy(study)).field).toBe('pressureKPa');
	});

	it('a cells/mL target beyond 200 g/L says the density it amounts to', () => {
		const study = studyOf({ profile: profileOf({ cellDryMassPg: 250 }) });
		study.plan.targetBasis = 'cellsPerMl';
		study.plan.inoculumDensity = 4e5;
		const error = errorOf(() => evaluateStudy(study, { targetValue: 1e9 }));
		// 1e9 cells/mL × 250 pg × 1e-9 = 250 g/L.
		expect(error.message).toBe(
			'A target of 1.00e+9 cells/mL is 250 g/L dry biomass at 250 pg/cell: beyond physical sense (above 200 g/L).'
		);
	});

	it("data the study cannot use is the study's: StudyDataError at the profile or vessel field", () => {
		const noMu = errorOf(() => evaluateStudy(studyOf({ profile: profileOf({ muMaxPerH: null }) })));
		expect(noMu).toBeInstanceOf(StudyDataError);
		expect(noMu.field).toBe('profile.muMaxPerH');
		expect(noMu.message).toBe(
			'The organism profile “Test bacterium” has no μmax, which this study needs. Edit the profile and add it.'
		);
		const cells = studyOf();
		cells.plan.targetBasis = 'cellsPerMl';
		cells.plan.targetValue = 1e7;
		const noMass = errorOf(() => evaluateStudy(cells));
		expect(noMass).toBeInstanceOf(StudyDataError);
		expect(noMass.field).toBe('profile.cellDryMassPg');
		const noKLa = errorOf(() => evaluateStudy(studyOf({ vessel: vesselOf({ kLaPerH: null }) })));
		expect(noKLa).toBeInstanceOf(StudyDataError);
		expect(noKLa.field).toBe('vessel.kLaPerH');
	});

	it("a substrate-stat feed without more carbon than its setpoint is the study's data, at the feed's field", () => {
		const plan = {
			...constantPlan(4),
			strategy: 'substrateStat' as const,
			setpointGPerL: 1,
			maxRateLPerH: 0.5
		};
		const error = errorOf(() =>
			evaluateStudy(studyOf({ feeds: [feedOf(2, plan, { [GLUCOSE]: 0.5 })] }))
		);
		expect(error).toBeInstanceOf(ChemistryInputError);
		expect(error).toBeInstanceOf(StudyDataError);
		expect(error.field).toBe('feed1Strategy');
		expect(error.message).toMatch(
			/^Glucose feed carries 0\.500 g\/L D-glucose, not more than the setpoint of 1 g\/L/
		);
	});
});

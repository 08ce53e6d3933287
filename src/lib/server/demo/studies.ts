import { eq } from 'drizzle-orm';
import {
	AIR_O2_MOLE_FRACTION,
	STANDARD_BIOMASS_FORMULA,
	findBiomassComposition,
	organicMassFractions,
	parseFormula,
	solveAerobicGrowth,
	statementsOfComposition
} from '$chemistry';
import { blankLine, type DraftFieldsInput, type DraftLineInput } from '$lib/recipes';
import type { FeedPlanStrategy } from '$lib/studies';
import { db } from '../db';
import { organismProfile, recipe, study, vessel } from '../db/schema';
import { findUserByEmail, rolesOf } from '../people';
import { checkDraft } from '../recipes/draft';
import { createRecipe, saveDraft } from '../recipes/drafts';
import { currentApprovedVersion, findVersion, latestVersion } from '../recipes/queries';
import { signVersion, submitForReview } from '../recipes/workflow';
import { demoAcknowledgements } from './acknowledgements';
import { saveProfile } from '../studies/profile-store';
import type { StudyForm } from '../studies/study-form';
import { createStudy } from '../studies/study-store';
import { saveVessel, type VesselForm } from '../studies/vessel-store';
import type { OrganismProfileRow } from '../db/schema';
import { DEMO_PASSWORD } from './accounts';

/*
 * Invented organisms, vessels and studies of Pilot Plant North. Every growth and vessel number is a
 * demo value chosen in a realistic range; the elemental fractions come from the published tables
 * in `$chemistry` and carry their source.
 */

const DEMO_NOTE =
	'Demo values for the Pilot Plant North scenario: replace them with your own measurements.';

function presetFractions(id: string) {
	const preset = findBiomassComposition(id)!;
	return {
		elementalFractions: Object.fromEntries(
			Object.entries(preset.massFractions).map(([k, v]) => [k, Number(v.value.toPrecision(4))])
		),
		fractionsSource: preset.source,
		elementStatements: statementsOfComposition(preset),
		ashFraction: preset.ashFraction?.value ?? null,
		biomassFormula: preset.formula
	};
}

/** Demo value, mol CO2 per mol O2, in the usual range for aerobic growth on glucose. */
const BACTERIUM_RQ = 1.05;
/** Demo value, g ash per g dry biomass: the Neidhardt table's minerals add up to 7.7 %. */
const BACTERIUM_ASH = 0.08;

/*
 * The demo bacterium's C, H, O, N are derived from the standard formula CH1.8O0.5N0.2 (Roels 1983;
 * Heijnen) with 8 % ash, as the yeast and cell-line tables derive theirs, so that the N demand and
 * the element balance that turns the RQ into Yx/s describe the same cells: C 44.9 %, H 6.78 %,
 * O 29.9 %, N 10.5 %. Its minerals stay those of Neidhardt, Ingraham & Schaechter (1990). The other
 * way round, a formula from the Neidhardt fractions (C 50, H 8, O 20, N 14 %) would be CH1.91O0.30N0.24,
 * more reduced (4.59 electrons per C-mol against 4.2) than measured biomass usually is; with it RQ 1.05
 * would mean Yx/s 0.20 g/g, a poor yield for a bacterium on glucose.
 */
function bacteriumFractions() {
	const neidhardt = presetFractions('bacterium-neidhardt-1990');
	const organic = organicMassFractions(
		parseFormula(STANDARD_BIOMASS_FORMULA).elements,
		BACTERIUM_ASH
	);
	const source = `C, H, O, N: standard formula ${STANDARD_BIOMASS_FORMULA} (Roels 1983; Heijnen) with ${BACTERIUM_ASH * 100} % ash (demo value); other elements: Neidhardt, Ingraham & Schaechter (1990)`;
	return {
		elementalFractions: {
			...neidhardt.elementalFractions,
			...Object.fromEntries(Object.entries(organic).map(([k, v]) => [k, Number(v.toPrecision(4))]))
		},
		fractionsSource: source,
		elementStatements: {
			...neidhardt.elementStatements,
			...Object.fromEntries(
				Object.keys(organic).map((k) => [
					k,
					{
						confidence: 'derived' as const,
						source: `Standard formula ${STANDARD_BIOMASS_FORMULA} (Roels 1983; Heijnen) with ${BACTERIUM_ASH * 100} % ash (demo value)`
					}
				])
			)
		},
		ashFraction: BACTERIUM_ASH,
		biomassFormula: STANDARD_BIOMASS_FORMULA
	};
}

type ProfileValues = Omit<
	OrganismProfileRow,
	'id' | 'createdAt' | 'updatedAt' | 'revision' | 'isDemo'
>;

export const DEMO_PROFILES: ProfileValues[] = [
	{
		name: 'Demo bacterium PPN-B1',
		group: 'bacterium',
		kind: 'elementalFractions',
		...bacteriumFractions(),
		componentRequirements: null,
		perCellConsumption: null,
		cellDryMassPg: 0.28,
		carbonSourceId: 'd-glucose',
		// Worked out from the measured RQ by element balance, as the profile form does on save.
		yieldXSMethod: 'respiratoryQuotient',
		respiratoryQuotient: BACTERIUM_RQ,
		yieldXSGPerG: Number(
			solveAerobicGrowth({
				substrateFormula: 'C6H12O6',
				biomassFormula: STANDARD_BIOMASS_FORMULA,
				ashFraction: BACTERIUM_ASH,
				measured: { kind: 'respiratoryQuotient', molCo2PerMolO2: BACTERIUM_RQ }
			}).biomassOnSubstrateGPerG.toPrecision(4)
		),
		substrateYields: [],
		muMaxPerH: 0.6,
		ksGPerL: 0.05,
		maintenanceGPerGH: 0.03,
		yieldXO2GPerG: null,
		qO2MmolPerGH: null,
		notes: `${DEMO_NOTE} Yx/s comes from the measured RQ and Yx/O2 from the element balance.`
	},
	{
		name: 'Demo yeast PPN-Y2',
		group: 'yeast',
		kind: 'elementalFractions',
		...presetFractions('yeast-bionumbers-101801'),
		componentRequirements: null,
		perCellConsumption: null,
		cellDryMassPg: 15,
		carbonSourceId: 'glycerol',
		yieldXSMethod: 'entered',
		respiratoryQuotient: null,
		yieldXSGPerG: 0.5,
		substrateYields: [],
		muMaxPerH: 0.2,
		ksGPerL: 0.1,
		maintenanceGPerGH: 0.01,
		yieldXO2GPerG: 0.9,
		qO2MmolPerGH: null,
		notes: DEMO_NOTE
	},
	{
		name: 'Demo mammalian line PPN-M3',
		group: 'mammalian',
		kind: 'perCell',
		biomassFormula: 'CH1.79O0.5N0.2',
		ashFraction: 0.07,
		elementalFractions: null,
		fractionsSource: null,
		elementStatements: null,
		componentRequirements: null,
		// Consumed per 10^9 cells formed over a fed-batch (demo values).
		perCellConsumption: [
			{ key: 'd-glucose', basis: 'component', mmolPer1e9Cells: 14, molarMassGPerMol: 180.156 },
			{ key: 'l-leucine', basis: 'component', mmolPer1e9Cells: 0.9, molarMassGPerMol: 131.175 },
			{ key: 'l-lysine', basis: 'component', mmolPer1e9Cells: 0.6, molarMassGPerMol: 146.19 },
			{ key: 'l-tyrosine', basis: 'component', mmolPer1e9Cells: 0.3, molarMassGPerMol: 181.191 }
		],
		cellDryMassPg: 300,
		carbonSourceId: 'd-glucose',
		yieldXSMethod: 'entered',
		respiratoryQuotient: null,
		yieldXSGPerG: 0.2,
		// Glutamine as a second substrate by its yield: 3 mmol per 10^9 cells × 146.146 g/mol over 300 pg per cell
		// is 1.46 g glutamine per g dry biomass, Yx/gln = 0.684 g/g (demo value).
		substrateYields: [{ componentId: 'l-glutamine', method: 'entered', yieldGPerG: 0.684 }],
		muMaxPerH: 0.035,
		ksGPerL: 0.15,
		maintenanceGPerGH: 0.005,
		yieldXO2GPerG: null,
		// 2.7e-13 mol per cell per hour (Ducommun et al. 2000 range) over 300 pg per cell.
		qO2MmolPerGH: 0.9,
		notes: DEMO_NOTE
	}
];

export const DEMO_VESSELS: VesselForm[] = [
	{
		name: 'Bench stirred tank BST-10',
		minWorkingVolumeL: 3,
		maxWorkingVolumeL: 10,
		kLaMode: 'entered',
		kLaPerH: 400,
		correlationK: null,
		correlationA: null,
		correlationB: null,
		powerPerVolumeWPerM3: null,
		superficialVelocityMPerS: null,
		maxGasFlowVvm: 2,
		o2EnrichmentAllowed: true,
		maxPressureKPa: 150,
		temperatureC: 30,
		coolingCapacityW: 600,
		agitationPowerW: 30,
		vesselDiameterM: 0.2,
		impellerDiameterM: 0.07,
		impellerCount: 2,
		powerNumber: null,
		plannedAgitationRpm: 800,
		plannedGasFlowLPerMin: 8,
		notes: DEMO_NOTE
	},
	{
		name: 'Pilot vessel PV-200',
		minWorkingVolumeL: 60,
		maxWorkingVolumeL: 200,
		kLaMode: 'correlation',
		kLaPerH: null,
		correlationK: 0.026,
		correlationA: 0.4,
		correlationB: 0.5,
		powerPerVolumeWPerM3: 2000,
		superficialVelocityMPerS: 0.01,
		maxGasFlowVvm: 1,
		o2EnrichmentAllowed: false,
		maxPressureKPa: 200,
		temperatureC: 37,
		coolingCapacityW: 8000,
		agitationPowerW: 400,
		vesselDiameterM: 0.55,
		impellerDiameterM: 0.18,
		impellerCount: 2,
		powerNumber: 5.5,
		plannedAgitationRpm: 300,
		plannedGasFlowLPerMin: 150,
		notes: `${DEMO_NOTE} Correlation constants as for coalescing broth in van 't Riet's form; P/V and gas velocity at the usual operating point.`
	}
];

type Line = [componentId: string, amount: number, unit: string];

const DEMO_FEEDS: {
	name: string;
	lines: Line[];
	stock?: [string, number];
	instructions: string;
}[] = [
	{
		name: 'PPN Glycerol Feed Y2',
		lines: [
			['glycerol', 500, 'g/L'],
			['ammonium-sulfate', 70, 'g/L'],
			['potassium-dihydrogen-phosphate', 20, 'g/L'],
			['magnesium-sulfate-heptahydrate', 12, 'g/L'],
			['calcium-chloride-dihydrate', 1, 'g/L'],
			['zinc-sulfate-heptahydrate', 0.1, 'g/L']
		],
		stock: ['PPN Trace Elements T2', 30],
		instructions:
			'Concentrated glycerol and salts feed for the yeast fed-batch. Dissolve the salts in 400 mL warm water, add the glycerol, make up to 1 L and filter through 0.2 µm. Add the calcium last, slowly, with stirring.'
	},
	{
		name: 'PPN Nitrogen Top-up N2',
		lines: [
			['ammonium-sulfate', 200, 'g/L'],
			['iron-ii-sulfate-heptahydrate', 2, 'g/L'],
			['zinc-sulfate-heptahydrate', 0.3, 'g/L']
		],
		instructions:
			'Nitrogen and trace-metal top-up feed, carrying no carbon. Dissolve the ammonium sulfate in purified water, then the iron and zinc salts, make up to volume and filter through 0.2 µm. Wear eye protection: the solution is acidic. No calcium or phosphate here: with this much sulfate they would precipitate.'
	},
	{
		name: 'PPN Glucose Feed B1',
		lines: [
			['d-glucose', 550, 'g/L'],
			['magnesium-sulfate-heptahydrate', 10, 'g/L']
		],
		instructions:
			'Glucose feed for the bacterial fed-batch. Dissolve the glucose in hot purified water with stirring (scald risk), add the magnesium sulfate, make up to volume and autoclave.'
	}
];

const FEED_FIELDS: DraftFieldsInput = {
	targetPh: '',
	osmolalityMinMOsmPerKg: '',
	osmolalityMaxMOsmPerKg: '',
	preparationTemperatureC: '25',
	shelfLifeDays: '14',
	storage: '2–8 °C',
	instructions: '',
	changeNote: 'First issue.'
};

async function seedDemoFeeds(): Promise<number> {
	const author = findUserByEmail('scientist@demo.test');
	const approverUser = findUserByEmail('engineer@demo.test');
	if (!author || !approverUser) return 0;
	const actor = { id: author.id, email: author.email };
	let added = 0;
	for (const feed of DEMO_FEEDS) {
		if (db.select().from(recipe).where(eq(recipe.name, feed.name)).get()) continue;
		const lines: DraftLineInput[] = feed.lines.map(([componentId, amount, unit]) => ({
			...blankLine('component'),
			componentId,
			amount: String(amount),
			unit
		}));
		if (feed.stock) {
			const stock = db.select().from(recipe).where(eq(recipe.name, feed.stock[0])).get();
			if (stock)
				lines.push({
					...blankLine('stock'),
					stockRecipeId: stock.id,
					amount: String(feed.stock[1])
				});
		}
		const recipeId = createRecipe(actor, { name: feed.name, kind: 'feed' });
		const version = findVersion(recipeId, 1)!;
		const checked = checkDraft(
			{ fields: { ...FEED_FIELDS, instructions: feed.instructions }, lines },
			recipeId
		);
		if (!checked.ok)
			throw new Error(`Demo feed ${feed.name} is invalid: ${JSON.stringify(checked.fieldErrors)}`);
		const revision = saveDraft(actor, version.id, version.revision, checked.value);
		submitForReview(actor, version.id, revision);
		await signVersion(
			{ id: approverUser.id, email: approverUser.email, roles: rolesOf(approverUser.id) },
			version.id,
			{
				password: DEMO_PASSWORD,
				meaning: 'approved',
				comment: 'Fine for the demo fed-batch.',
				acknowledgements: demoAcknowledgements(version.id)
			}
		);
		added++;
	}
	return added;
}

function versionIdOf(recipeName: string): string | null {
	const r = db.select().from(recipe).where(eq(recipe.name, recipeName)).get();
	if (!r) return null;
	return (currentApprovedVersion(r.id) ?? latestVersion(r.id))?.id ?? null;
}

const idByName = (table: typeof organismProfile | typeof vessel, name: string) =>
	db.select({ id: table.id }).from(table).where(eq(table.name, name)).get()?.id ?? null;

interface DemoFeed {
	recipe: string;
	volumeL: number;
	plan: {
		Strategy: FeedPlanStrategy;
		StartH: number;
		MuSetPerH?: number;
		SetpointGPerL?: number;
		DoSetpointPercent?: number;
		MaxRateLPerH?: number;
	};
}

interface DemoStudy {
	name: string;
	basal: string;
	profile: string;
	vessel: string;
	feeds: DemoFeed[];
	plan: Omit<
		StudyForm,
		'name' | 'basalVersionId' | 'profileId' | 'vesselId' | `feed${number}${string}`
	>;
}

export const DEMO_STUDIES: DemoStudy[] = [
	{
		name: 'Yeast glycerol fed-batch, bench (demo)',
		basal: 'PPN Yeast-Glycerol A',
		profile: 'Demo yeast PPN-Y2',
		vessel: 'Bench stirred tank BST-10',
		feeds: [
			{ recipe: 'PPN Glycerol Feed Y2', volumeL: 2, plan: { Strategy: 'constant', StartH: 24 } }
		],
		plan: {
			targetBasis: 'biomassGPerL',
			targetValue: 40,
			initialVolumeL: 6,
			inoculumDensity: 0.2,
			durationH: 60,
			temperatureC: 30,
			pressureKPa: 120,
			o2MoleFraction: 0.5,
			doSetpointPercent: 30,
			safetyFactor: 1.2,
			heatPerMolO2KJ: null,
			plannedAgitationRpm: null,
			plannedGasFlowLPerMin: null,
			notes:
				'Demo study: glycerol batch, then a constant glycerol-salts feed; O2-enriched air from the batch phase on.'
		}
	},
	{
		name: 'Bacterium glucose fed-batch, pilot (demo)',
		basal: 'NB-Min Salts 3',
		profile: 'Demo bacterium PPN-B1',
		vessel: 'Pilot vessel PV-200',
		feeds: [
			{
				recipe: 'PPN Glucose Feed B1',
				volumeL: 20,
				plan: { Strategy: 'exponential', StartH: 10, MuSetPerH: 0.15 }
			}
		],
		plan: {
			targetBasis: 'biomassGPerL',
			targetValue: 25,
			initialVolumeL: 120,
			inoculumDensity: 0.1,
			durationH: 30,
			temperatureC: 37,
			pressureKPa: 150,
			o2MoleFraction: AIR_O2_MOLE_FRACTION,
			doSetpointPercent: 30,
			safetyFactor: 1.2,
			heatPerMolO2KJ: null,
			plannedAgitationRpm: null,
			plannedGasFlowLPerMin: null,
			notes:
				'Demo study: the target is set deliberately high for this medium, to show what runs out first.'
		}
	},
	{
		name: 'Yeast DO-stat with nitrogen top-up, bench (demo)',
		basal: 'PPN Yeast-Glycerol A',
		profile: 'Demo yeast PPN-Y2',
		vessel: 'Bench stirred tank BST-10',
		feeds: [
			{
				recipe: 'PPN Glycerol Feed Y2',
				volumeL: 3,
				plan: { Strategy: 'doStat', StartH: 24, DoSetpointPercent: 35, MaxRateLPerH: 0.08 }
			},
			{ recipe: 'PPN Nitrogen Top-up N2', volumeL: 0.4, plan: { Strategy: 'constant', StartH: 24 } }
		],
		plan: {
			targetBasis: 'biomassGPerL',
			targetValue: 55,
			initialVolumeL: 5,
			inoculumDensity: 0.2,
			durationH: 60,
			temperatureC: 30,
			pressureKPa: 120,
			o2MoleFraction: 0.5,
			doSetpointPercent: 30,
			safetyFactor: 1.2,
			heatPerMolO2KJ: null,
			plannedAgitationRpm: null,
			plannedGasFlowLPerMin: null,
			notes:
				'Demo study: glycerol-salts feed on DO-stat (the pump runs while DO is above 35 % of air saturation, that is once the batch glycerol is gone), with a constant nitrogen and trace-metal top-up alongside; O2-enriched air.'
		}
	}
];

/** The form fields of a demo study's feeds, as the study form would send them. */
function feedFormFields(
	feeds: (DemoFeed & { versionId: string })[]
): Record<string, string | number> {
	return Object.fromEntries(
		feeds.flatMap((f, i) => [
			[`feed${i + 1}VersionId`, f.versionId],
			[`feed${i + 1}VolumeL`, f.volumeL],
			...Object.entries(f.plan).map(([field, value]) => [`feed${i + 1}${field}`, value])
		])
	);
}

/** Adds the demo profiles, vessels, feeds and studies that are missing (by name); returns how many. */
export async function seedDemoStudies(): Promise<number> {
	const engineer = findUserByEmail('engineer@demo.test');
	if (!engineer) return 0;
	const actor = { id: engineer.id, email: engineer.email };
	let added = await seedDemoFeeds();
	for (const p of DEMO_PROFILES) {
		if (idByName(organismProfile, p.name)) continue;
		saveProfile(actor, null, null, p, true);
		added++;
	}
	for (const v of DEMO_VESSELS) {
		if (idByName(vessel, v.name)) continue;
		saveVessel(actor, null, null, v, true);
		added++;
	}
	for (const s of DEMO_STUDIES) {
		if (db.select().from(study).where(eq(study.name, s.name)).get()) continue;
		const basalVersionId = versionIdOf(s.basal);
		const profileId = idByName(organismProfile, s.profile);
		const vesselId = idByName(vessel, s.vessel);
		const feeds = s.feeds.map((f) => ({ ...f, versionId: versionIdOf(f.recipe) }));
		if (!basalVersionId || !profileId || !vesselId || feeds.some((f) => !f.versionId)) continue;
		const form = {
			name: s.name,
			basalVersionId,
			profileId,
			vesselId,
			...s.plan,
			...feedFormFields(feeds as (DemoFeed & { versionId: string })[])
		} as StudyForm;
		await createStudy(actor, form);
		added++;
	}
	return added;
}

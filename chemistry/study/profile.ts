import { BIOMASS_COMPOSITIONS, STANDARD_BIOMASS_FORMULA } from '../data/biomass';
import { ChemistryInputError } from '../errors';
import { statementsOfComposition, type ElementStatement } from '../profile-elements';
import { balanceAerobicGrowth } from '../substrate-yield';
import type {
	CarbonDemand,
	ElementStatements,
	OrganismProfile,
	PerCellConsumption,
	SubstrateDemand
} from '../sufficiency';
import { StudyDataError } from './errors';
import {
	computeOxygenYieldFromUptake,
	describeCarbonYield,
	describeSubstrateYield
} from './profile-yields';
import type { DefaultUsed, StudyProfile } from './types';
import { YIELD_METHOD_LABELS } from './vocabulary';

function missing(profile: StudyProfile, what: string, field: string): never {
	throw new StudyDataError(
		`The organism profile “${profile.name}” has no ${what}, which this study needs. Edit the profile and add it.`,
		{
			field: `profile.${field}`
		}
	);
}

/** The growth numbers every study needs, whatever the profile's kind. */
export function requireGrowthData(profile: StudyProfile) {
	if (!profile.carbonSourceId) missing(profile, 'carbon source', 'carbonSourceId');
	if (profile.yieldXSGPerG === null)
		missing(profile, 'yield on the carbon source (Yx/s)', 'yieldXSGPerG');
	if (profile.muMaxPerH === null) missing(profile, 'μmax', 'muMaxPerH');
	if (profile.ksGPerL === null) missing(profile, 'Ks', 'ksGPerL');
	return {
		carbonSourceId: profile.carbonSourceId,
		yieldXSGPerG: profile.yieldXSGPerG,
		muMaxPerH: profile.muMaxPerH,
		ksGPerL: profile.ksGPerL
	};
}

/** Names and formulas of the library's components, as a study's loaded data carries them. */
export interface ComponentFacts {
	componentNames: Record<string, string>;
	componentFormulas: Record<string, string | null>;
}

/** The yields a study uses, each with where it came from, for the report's list of values used. */
export function listYieldsUsed(
	profile: StudyProfile,
	{ componentNames, componentFormulas }: ComponentFacts
): DefaultUsed[] {
	const growth = requireGrowthData(profile);
	const name = (id: string) => componentNames[id] ?? id;
	return [
		{
			what: `Yx/s on ${name(growth.carbonSourceId)}`,
			value: `${growth.yieldXSGPerG} g/g`,
			source: describeCarbonYield(profile, componentFormulas[growth.carbonSourceId] ?? null)
		},
		...profile.substrateYields.map((y) => ({
			what: `Yx/s on ${name(y.componentId)}`,
			value: `${y.yieldGPerG} g/g`,
			source: describeSubstrateYield(y)
		}))
	];
}

/** The yields for the profile page; none until the profile has its growth data. */
export function listProfileYields(
	profile: StudyProfile,
	components: ComponentFacts
): DefaultUsed[] {
	try {
		return listYieldsUsed(profile, components);
	} catch (cause) {
		if (cause instanceof StudyDataError) return [];
		throw cause;
	}
}

/** What the element rules read from a profile, stored or just checked on the form. */
export interface ProfileElementFields {
	elementalFractions: Record<string, number> | null;
	perCellConsumption: PerCellConsumption[] | null;
	fractionsSource: string | null;
	elementStatements?: ElementStatements | null;
}

/** The elements a profile gives a value for: its fractions and its per-cell element lines. */
export function listProfileElements(
	p: Pick<ProfileElementFields, 'elementalFractions' | 'perCellConsumption'>
): string[] {
	const fromCells = (p.perCellConsumption ?? [])
		.filter((c) => c.basis === 'element')
		.map((c) => c.key);
	return [...new Set([...Object.keys(p.elementalFractions ?? {}), ...fromCells])];
}

/**
 * The form keeps a published table's fractions to 4 significant digits; a fraction still at that
 * value, under that table's citation, is the table's value and carries its grade.
 */
function tableStatement(
	symbol: string,
	fraction: number | undefined,
	source: string | null
): ElementStatement | undefined {
	if (fraction === undefined || !source) return undefined;
	const table = BIOMASS_COMPOSITIONS.find((b) => b.source === source);
	const published = table?.massFractions[symbol];
	if (!table || !published || Number(published.value.toPrecision(4)) !== fraction) return undefined;
	return statementsOfComposition(table)[symbol];
}

/**
 * Each element's statement: the one stored with the profile; for a profile saved before statements
 * were kept, the grade of the published table its fractions came from; otherwise the fractions'
 * source with no stated confidence.
 */
export function resolveElementStatements(p: ProfileElementFields): ElementStatements {
	const out: ElementStatements = {};
	for (const symbol of listProfileElements(p)) {
		const stored = p.elementStatements?.[symbol];
		if (stored) {
			out[symbol] = stored;
			continue;
		}
		out[symbol] =
			tableStatement(symbol, p.elementalFractions?.[symbol], p.fractionsSource) ??
			(p.fractionsSource ? { source: p.fractionsSource } : {});
	}
	return out;
}

/**
 * The profile as the sufficiency engine reads it, with the carbon rule and the further substrates;
 * each element with its role and confidence, each yield with how it was obtained.
 */
export function toSufficiencyProfile(profile: StudyProfile): {
	profile: OrganismProfile;
	carbon?: CarbonDemand;
	substrates: SubstrateDemand[];
} {
	const growth = requireGrowthData(profile);
	const elements = resolveElementStatements(profile);
	const substrates = profile.substrateYields.map(toSubstrateDemand);
	const carbon = toCarbonDemand(profile, growth);
	const organism = toOrganismProfile(profile, elements);
	// A per-cell glucose uptake already includes what is respired; a yield-based line would count it twice.
	return organism.kind === 'perCell'
		? { profile: organism, substrates }
		: { profile: organism, carbon, substrates };
}

function toSubstrateDemand(y: StudyProfile['substrateYields'][number]): SubstrateDemand {
	return {
		component: y.componentId,
		yieldGPerG: y.yieldGPerG,
		note: `X / Yx/s with Yx/s = ${y.yieldGPerG} g/g (${describeSubstrateYield(y).toLowerCase()})`,
		confidence: y.method === 'entered' ? ('measured' as const) : ('derived' as const),
		source: describeSubstrateYield(y)
	};
}

function toCarbonDemand(
	profile: StudyProfile,
	growth: ReturnType<typeof requireGrowthData>
): CarbonDemand {
	return {
		basis: 'component',
		component: growth.carbonSourceId,
		yieldGPerG: growth.yieldXSGPerG,
		// The form offers "Entered (measured)"; the balance methods work it out from a measurement.
		confidence: profile.yieldXSMethod === 'entered' ? 'measured' : 'derived',
		source:
			profile.yieldXSMethod === 'entered'
				? 'Entered on the profile'
				: `${YIELD_METHOD_LABELS[profile.yieldXSMethod]} (see the yields a study uses)`
	};
}

/** The profile's demand by its kind; what that kind needs and the profile lacks is refused. */
function toOrganismProfile(profile: StudyProfile, elements: ElementStatements): OrganismProfile {
	const cellDryMassPg = profile.cellDryMassPg ?? undefined;
	switch (profile.kind) {
		case 'elementalFractions':
			if (!profile.elementalFractions || Object.keys(profile.elementalFractions).length === 0) {
				missing(profile, 'elemental mass fractions', 'elementalFractions');
			}
			return {
				kind: 'elementalFractions',
				name: profile.name,
				fractions: profile.elementalFractions,
				cellDryMassPg,
				elements,
				...(profile.biomassFormula
					? { formula: profile.biomassFormula, ashFraction: profile.ashFraction ?? undefined }
					: {})
			};
		case 'componentRequirements':
			if (
				!profile.componentRequirements ||
				Object.keys(profile.componentRequirements).length === 0
			) {
				missing(profile, 'component requirements', 'componentRequirements');
			}
			return {
				kind: 'componentRequirements',
				name: profile.name,
				requirementsGPerG: profile.componentRequirements,
				cellDryMassPg
			};
		case 'perCell':
			if (!profile.perCellConsumption || profile.perCellConsumption.length === 0) {
				missing(profile, 'per-cell consumption rates', 'perCellConsumption');
			}
			if (profile.cellDryMassPg === null)
				missing(profile, 'cell dry mass (pg/cell)', 'cellDryMassPg');
			return {
				kind: 'perCell',
				name: profile.name,
				consumption: profile.perCellConsumption,
				cellDryMassPg,
				elements
			};
	}
}

/**
 * Yx/O2 in g biomass per g O2: entered; else from qO2 taken at μmax (a culture growing at μmax
 * respires qO2 = μmax / Yx/O2); else from the element balance with Yx/s. The route taken is listed.
 */
export function resolveOxygenYield(
	profile: StudyProfile,
	carbonSourceFormula: string | null,
	defaults: DefaultUsed[]
): number {
	if (profile.yieldXO2GPerG !== null) return profile.yieldXO2GPerG;
	const growth = requireGrowthData(profile);
	if (profile.qO2MmolPerGH !== null) {
		const y = computeOxygenYieldFromUptake(growth.muMaxPerH, profile.qO2MmolPerGH);
		defaults.push({
			what: 'Yx/O2',
			value: `${y.toPrecision(3)} g/g`,
			source: `From the profile's qO2 ${profile.qO2MmolPerGH} mmol/(g·h), taken as measured at μmax ${growth.muMaxPerH} /h`
		});
		return y;
	}
	if (!carbonSourceFormula)
		missing(
			profile,
			'Yx/O2 or qO2 (and the carbon source has no formula for an element balance)',
			'yieldXO2GPerG'
		);
	const biomassFormula = profile.biomassFormula ?? STANDARD_BIOMASS_FORMULA;
	const ash = profile.ashFraction ?? 0;
	if (!profile.biomassFormula) {
		defaults.push({
			what: 'Biomass formula for the element balance',
			value: STANDARD_BIOMASS_FORMULA,
			source: 'Standard biomass formula (Roels 1983; Heijnen)'
		});
	}
	if (profile.ashFraction === null)
		defaults.push({
			what: 'Ash fraction for the element balance',
			value: '0',
			source: 'Not entered on the profile'
		});
	try {
		const y = balanceAerobicGrowth({
			substrateFormula: carbonSourceFormula,
			biomassFormula,
			ashFraction: ash,
			measured: { kind: 'substrateYield', gBiomassPerGSubstrate: growth.yieldXSGPerG }
		}).biomassOnOxygenGPerG;
		defaults.push({
			what: 'Yx/O2',
			value: `${y.toPrecision(3)} g/g`,
			source: `Element balance (C, H, O, N) with ${carbonSourceFormula}, NH3 as N source and Yx/s ${growth.yieldXSGPerG} g/g`
		});
		return y;
	} catch (cause) {
		if (!(cause instanceof ChemistryInputError)) throw cause;
		throw new StudyDataError(
			`The oxygen yield of “${profile.name}” cannot be worked out from its element balance (${cause.message}). Enter Yx/O2 or qO2 on the profile.`,
			{ field: 'profile.yieldXO2GPerG' }
		);
	}
}

import {
	ChemistryInputError,
	O2_MOLAR_MASS_G_PER_MOL,
	STANDARD_BIOMASS_FORMULA,
	balanceAerobicGrowth,
	type CarbonDemand,
	type OrganismProfile,
	type SubstrateDemand
} from '$chemistry';
import { YIELD_METHOD_LABELS } from '$lib/studies';
import { RuleError } from '../rule-error';
import { resolveElementStatements } from './profile-elements';
import { describeCarbonYield, describeSubstrateYield } from './profile-yields';
import type { DefaultUsed, OrganismProfileRow } from './types';

function missing(profile: OrganismProfileRow, what: string, field: string): never {
	throw new RuleError(`The organism profile “${profile.name}” has no ${what}, which this study needs. Edit the profile and add it.`, {
		field: `profile.${field}`,
		status: 422
	});
}

/** The growth numbers every study needs, whatever the profile's kind. */
export function requireGrowthData(profile: OrganismProfileRow) {
	if (!profile.carbonSourceId) missing(profile, 'carbon source', 'carbonSourceId');
	if (profile.yieldXSGPerG === null) missing(profile, 'yield on the carbon source (Yx/s)', 'yieldXSGPerG');
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
export function listYieldsUsed(profile: OrganismProfileRow, { componentNames, componentFormulas }: ComponentFacts): DefaultUsed[] {
	const growth = requireGrowthData(profile);
	const name = (id: string) => componentNames[id] ?? id;
	return [
		{ what: `Yx/s on ${name(growth.carbonSourceId)}`, value: `${growth.yieldXSGPerG} g/g`, source: describeCarbonYield(profile, componentFormulas[growth.carbonSourceId] ?? null) },
		...profile.substrateYields.map((y) => ({ what: `Yx/s on ${name(y.componentId)}`, value: `${y.yieldGPerG} g/g`, source: describeSubstrateYield(y) }))
	];
}

/** The yields for the profile page; none until the profile has its growth data. */
export function listProfileYields(profile: OrganismProfileRow, components: ComponentFacts): DefaultUsed[] {
	try {
		return listYieldsUsed(profile, components);
	} catch (cause) {
		if (cause instanceof RuleError) return [];
		throw cause;
	}
}

/**
 * The profile as the sufficiency engine reads it, with the carbon rule and the further substrates;
 * each element with its role and confidence, each yield with how it was obtained.
 */
export function toSufficiencyProfile(profile: OrganismProfileRow): { profile: OrganismProfile; carbon?: CarbonDemand; substrates: SubstrateDemand[] } {
	const cellDryMassPg = profile.cellDryMassPg ?? undefined;
	const growth = requireGrowthData(profile);
	const elements = resolveElementStatements(profile);
	const substrates = profile.substrateYields.map((y) => ({
		component: y.componentId,
		yieldGPerG: y.yieldGPerG,
		note: `X / Yx/s with Yx/s = ${y.yieldGPerG} g/g (${describeSubstrateYield(y).toLowerCase()})`,
		confidence: y.method === 'entered' ? ('measured' as const) : ('derived' as const),
		source: describeSubstrateYield(y)
	}));
	// A per-cell glucose uptake already includes what is respired; a yield-based line would count it twice.
	const carbon: CarbonDemand = {
		basis: 'component',
		component: growth.carbonSourceId,
		yieldGPerG: growth.yieldXSGPerG,
		// The form offers "Entered (measured)"; the balance methods work it out from a measurement.
		confidence: profile.yieldXSMethod === 'entered' ? 'measured' : 'derived',
		source: profile.yieldXSMethod === 'entered' ? 'Entered on the profile' : `${YIELD_METHOD_LABELS[profile.yieldXSMethod]} (see the yields a study uses)`
	};
	switch (profile.kind) {
		case 'elementalFractions':
			if (!profile.elementalFractions || Object.keys(profile.elementalFractions).length === 0) {
				missing(profile, 'elemental mass fractions', 'elementalFractions');
			}
			return {
				profile: {
					kind: 'elementalFractions',
					name: profile.name,
					fractions: profile.elementalFractions,
					cellDryMassPg,
					elements,
					...(profile.biomassFormula ? { formula: profile.biomassFormula, ashFraction: profile.ashFraction ?? undefined } : {})
				},
				carbon,
				substrates
			};
		case 'componentRequirements':
			if (!profile.componentRequirements || Object.keys(profile.componentRequirements).length === 0) {
				missing(profile, 'component requirements', 'componentRequirements');
			}
			return { profile: { kind: 'componentRequirements', name: profile.name, requirementsGPerG: profile.componentRequirements, cellDryMassPg }, carbon, substrates };
		case 'perCell':
			if (!profile.perCellConsumption || profile.perCellConsumption.length === 0) {
				missing(profile, 'per-cell consumption rates', 'perCellConsumption');
			}
			if (profile.cellDryMassPg === null) missing(profile, 'cell dry mass (pg/cell)', 'cellDryMassPg');
			return { profile: { kind: 'perCell', name: profile.name, consumption: profile.perCellConsumption, cellDryMassPg, elements }, substrates };
	}
}

/**
 * Yx/O2 in g biomass per g O2: entered; else from qO2 taken at μmax (a culture growing at μmax
 * respires qO2 = μmax / Yx/O2); else from the element balance with Yx/s. The route taken is listed.
 */
export function resolveOxygenYield(
	profile: OrganismProfileRow,
	carbonSourceFormula: string | null,
	defaults: DefaultUsed[]
): number {
	if (profile.yieldXO2GPerG !== null) return profile.yieldXO2GPerG;
	const growth = requireGrowthData(profile);
	if (profile.qO2MmolPerGH !== null) {
		const y = growth.muMaxPerH / ((profile.qO2MmolPerGH * O2_MOLAR_MASS_G_PER_MOL) / 1000);
		defaults.push({
			what: 'Yx/O2',
			value: `${y.toPrecision(3)} g/g`,
			source: `From the profile's qO2 ${profile.qO2MmolPerGH} mmol/(g·h), taken as measured at μmax ${growth.muMaxPerH} /h`
		});
		return y;
	}
	if (!carbonSourceFormula) missing(profile, 'Yx/O2 or qO2 (and the carbon source has no formula for an element balance)', 'yieldXO2GPerG');
	const biomassFormula = profile.biomassFormula ?? STANDARD_BIOMASS_FORMULA;
	const ash = profile.ashFraction ?? 0;
	if (!profile.biomassFormula) {
		defaults.push({ what: 'Biomass formula for the element balance', value: STANDARD_BIOMASS_FORMULA, source: 'Standard biomass formula (Roels 1983; Heijnen)' });
	}
	if (profile.ashFraction === null) defaults.push({ what: 'Ash fraction for the element balance', value: '0', source: 'Not entered on the profile' });
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
		throw new RuleError(
			`The oxygen yield of “${profile.name}” cannot be worked out from its element balance (${cause.message}). Enter Yx/O2 or qO2 on the profile.`,
			{ field: 'profile.yieldXO2GPerG', status: 422 }
		);
	}
}

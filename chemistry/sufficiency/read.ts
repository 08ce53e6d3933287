// Reading the supply, the target and the organism profile: every refusal names its field.
import { ATOMIC_WEIGHTS } from '../data/atomic-weights';
import { findBiomassComposition, BIOMASS_COMPOSITIONS } from '../data/biomass';
import { defaultElementRole } from '../data/element-roles';
import { ChemistryInputError } from '../errors';
import { readNonNegative, readPositive } from '../input';
import {
	VALUE_CONFIDENCES,
	compareFractionsWithFormula,
	readElementStatements,
	statementsOfComposition,
	type ElementStatement,
	type ValueConfidence
} from '../profile-elements';
import {
	type SupplyBasis,
	type OrganismProfile,
	type SupplyInput,
	type Supply,
	type LineStanding,
	type Target
} from './types';

export function fail(message: string, field?: string): never {
	throw new ChemistryInputError(message, field ? { field } : {});
}

export function requireElement(symbol: string, field: string): void {
	if (!(symbol in ATOMIC_WEIGHTS))
		fail(`'${symbol}' is not an element symbol with a standard atomic weight`, field);
}

export function readMap(
	value: unknown,
	field: string,
	basis: SupplyBasis,
	what: string
): Record<string, number> {
	if (value === undefined) return {};
	if (value === null || typeof value !== 'object' || Array.isArray(value))
		fail(`${what} must be an object of numbers`, field);
	const out: Record<string, number> = {};
	for (const [key, v] of Object.entries(value as Record<string, unknown>)) {
		if (basis === 'element') requireElement(key, `${field}.${key}`);
		out[key] = readNonNegative(v, `${field}.${key}`, `${what} of ${key}`);
	}
	return out;
}

export function readSupply(input: unknown): Supply {
	if (input === null || typeof input !== 'object')
		fail('Supply must be an object with sources', 'supply');
	const supply = input as SupplyInput;
	if (!Array.isArray(supply.sources) || supply.sources.length === 0) {
		fail('Supply needs at least one source (the medium, feeds)', 'supply.sources');
	}
	const sources = supply.sources.map((raw, i) => {
		const field = `supply.sources.${i}`;
		if (raw === null || typeof raw !== 'object') fail('Each source must be an object', field);
		return {
			volumeL:
				raw.volumeL === undefined
					? undefined
					: readPositive(raw.volumeL, `${field}.volumeL`, 'Source volume'),
			elementsGPerL: readMap(
				raw.elementsGPerL,
				`${field}.elementsGPerL`,
				'element',
				'Element concentration'
			),
			componentsGPerL: readMap(
				raw.componentsGPerL,
				`${field}.componentsGPerL`,
				'component',
				'Component concentration'
			),
			elementsG: readMap(raw.elementsG, `${field}.elementsG`, 'element', 'Element amount'),
			componentsG: readMap(raw.componentsG, `${field}.componentsG`, 'component', 'Component amount')
		};
	});
	let finalVolumeL: number | null =
		supply.finalVolumeL === undefined
			? null
			: readPositive(supply.finalVolumeL, 'supply.finalVolumeL', 'Final volume');
	const needsVolume = sources.some(
		(s) =>
			s.volumeL !== undefined ||
			Object.keys(s.elementsG).length > 0 ||
			Object.keys(s.componentsG).length > 0
	);
	if (finalVolumeL === null && needsVolume) {
		if (sources.every((s) => s.volumeL !== undefined)) {
			finalVolumeL = sources.reduce((acc, s) => acc + (s.volumeL ?? 0), 0);
		} else {
			fail(
				'Final volume is needed: some sources give a volume or total grams while others do not',
				'supply.finalVolumeL'
			);
		}
	}
	const element = new Map<string, number>();
	const component = new Map<string, number>();
	const add = (target: Map<string, number>, key: string, gPerL: number) =>
		target.set(key, (target.get(key) ?? 0) + gPerL);
	for (const s of sources) {
		const dilution =
			s.volumeL !== undefined && finalVolumeL !== null ? s.volumeL / finalVolumeL : 1;
		for (const [k, v] of Object.entries(s.elementsGPerL)) add(element, k, v * dilution);
		for (const [k, v] of Object.entries(s.componentsGPerL)) add(component, k, v * dilution);
		for (const [k, v] of Object.entries(s.elementsG)) add(element, k, v / (finalVolumeL as number));
		for (const [k, v] of Object.entries(s.componentsG))
			add(component, k, v / (finalVolumeL as number));
	}
	return { finalVolumeL, element, component };
}

/** An element's standing: the profile's statement where it makes one, else the default role and 'unstated'. */
export function elementStanding(
	symbol: string,
	statement: ElementStatement | undefined
): LineStanding {
	return {
		role: statement?.role ?? defaultElementRole(symbol),
		roleFrom: statement?.role ? 'profile' : 'default',
		confidence: statement?.confidence ?? 'unstated',
		source: statement?.source ?? null
	};
}

/** The carbon source, a further substrate or a component demand: required; how sure, as given. */
export function requiredStanding(
	basis: { confidence?: unknown; source?: unknown },
	field: string
): LineStanding {
	const { confidence, source } = basis;
	if (confidence !== undefined && !(VALUE_CONFIDENCES as readonly unknown[]).includes(confidence))
		fail(`Confidence must be one of ${VALUE_CONFIDENCES.join(', ')}`, `${field}.confidence`);
	if (source !== undefined && typeof source !== 'string')
		fail('Source must be text', `${field}.source`);
	return {
		role: 'required',
		roleFrom: 'default',
		confidence: (confidence as ValueConfidence | undefined) ?? 'unstated',
		source: (source as string | undefined) || null
	};
}

/** Cell density to dry biomass, exact by the SI prefixes: 1 cell/mL × 1 pg/cell = 1e3 cells/L × 1e-12 g = 1e-9 g/L. */
export const G_PER_L_PER_CELL_PER_ML_PER_PG = 1e-9;

export function readTarget(input: unknown, profileDryMassPg: number | null): Target {
	if (input === null || typeof input !== 'object')
		fail('Target must be { biomassGPerL } or { cellsPerMl }', 'target');
	if ('biomassGPerL' in input) {
		const x = readPositive(
			(input as { biomassGPerL: unknown }).biomassGPerL,
			'target.biomassGPerL',
			'Target biomass'
		);
		const pg = profileDryMassPg;
		return {
			biomassGPerL: x,
			cellsPerMl: pg ? x / (pg * G_PER_L_PER_CELL_PER_ML_PER_PG) : null,
			cellDryMassPg: pg
		};
	}
	if ('cellsPerMl' in input) {
		const t = input as { cellsPerMl: unknown; cellDryMassPg?: unknown };
		const cells = readPositive(t.cellsPerMl, 'target.cellsPerMl', 'Target cell density');
		const pg =
			t.cellDryMassPg !== undefined
				? readPositive(t.cellDryMassPg, 'target.cellDryMassPg', 'Cell dry mass')
				: profileDryMassPg;
		return {
			biomassGPerL: pg ? cells * pg * G_PER_L_PER_CELL_PER_ML_PER_PG : null,
			cellsPerMl: cells,
			cellDryMassPg: pg
		};
	}
	fail('Target must be { biomassGPerL } or { cellsPerMl }', 'target');
}

export function resolveProfile(profile: unknown): Exclude<OrganismProfile, { kind: 'preset' }> {
	if (profile === null || typeof profile !== 'object')
		fail('Profile must be an object with a kind', 'profile');
	const p = profile as OrganismProfile;
	if (p.kind === 'preset') {
		const found = typeof p.id === 'string' ? findBiomassComposition(p.id) : undefined;
		if (!found) {
			fail(
				`Unknown biomass preset '${String(p.id)}'; available: ${BIOMASS_COMPOSITIONS.map((b) => b.id).join(', ')}`,
				'profile.id'
			);
		}
		// The table's own confidence for each value, under whatever the request states on top.
		const overrides = readElementStatements(
			p.elements,
			'profile.elements',
			new Set(Object.keys(found.massFractions))
		);
		return {
			kind: 'elementalFractions',
			name: found.name,
			fractions: Object.fromEntries(
				Object.entries(found.massFractions).map(([k, v]) => [k, v.value])
			),
			cellDryMassPg: found.cellDryMassPg?.value,
			elements: Object.fromEntries(
				Object.entries(statementsOfComposition(found)).map(([k, v]) => [
					k,
					{ ...v, ...overrides[k] }
				])
			),
			formula: found.formula ?? undefined,
			ashFraction: found.ashFraction?.value
		};
	}
	if (p.kind === 'elementalFractions' || p.kind === 'componentRequirements' || p.kind === 'perCell')
		return p;
	fail(
		`Unknown profile kind '${String((p as { kind?: unknown }).kind)}'; use 'preset', 'elementalFractions', 'componentRequirements' or 'perCell'`,
		'profile.kind'
	);
}

export function requireBiomass(target: Target, why: string): number {
	if (target.biomassGPerL === null) {
		fail(
			`${why} needs the target as dry biomass: give target.cellDryMassPg (or the profile's) with cellsPerMl`,
			'target.cellDryMassPg'
		);
	}
	return target.biomassGPerL;
}

/** The fractions of an elemental profile against its formula, when it gives one. */
export function checkProfileFormula(
	profile: Exclude<OrganismProfile, { kind: 'preset' }>
): string[] {
	if (profile.kind !== 'elementalFractions' || profile.formula === undefined) return [];
	if (typeof profile.formula !== 'string' || profile.formula.trim() === '')
		fail('Biomass formula must be text, e.g. CH1.8O0.5N0.2', 'profile.formula');
	let ashFraction: number | null = null;
	if (profile.ashFraction !== undefined) {
		ashFraction = readNonNegative(profile.ashFraction, 'profile.ashFraction', 'Ash fraction');
		if (ashFraction >= 1)
			fail(
				`Ash fraction must be below 1 g per g dry biomass, not ${ashFraction}`,
				'profile.ashFraction'
			);
	}
	return compareFractionsWithFormula({
		formula: profile.formula,
		ashFraction,
		fractions: profile.fractions,
		field: 'profile.formula'
	}).map((m) => m.message);
}

// What the target needs of each element: per-cell statements, the carbon demand and the substrates.
import { ATOMIC_WEIGHTS } from '../data/atomic-weights';
import { ChemistryInputError } from '../errors';
import { readNonNegative, readPositive } from '../input';
import { formulaMolarMass } from '../formula';
import { readElementStatements } from '../profile-elements';
import {
	type ElementStatements,
	type OrganismProfile,
	type PerCellConsumption,
	type CarbonDemand,
	type SubstrateDemand,
	type Requirement,
	type Target
} from './types';
import {
	fail,
	requireElement,
	readMap,
	elementStanding,
	requiredStanding,
	G_PER_L_PER_CELL_PER_ML_PER_PG,
	requireBiomass
} from './read';

export function buildRequirements(
	profile: Exclude<OrganismProfile, { kind: 'preset' }>,
	target: Target,
	ignored: Set<string>
): Requirement[] {
	if (profile.kind === 'elementalFractions')
		return requirementsFromFractions(profile, target, ignored);
	if (profile.kind === 'componentRequirements') return requirementsPerGram(profile, target);
	return requirementsPerCell(profile, target, ignored);
}

type ProfileOf<K extends OrganismProfile['kind']> = Extract<OrganismProfile, { kind: K }>;

/** Demand of each element from its mass fraction of dry biomass. */
function requirementsFromFractions(
	profile: ProfileOf<'elementalFractions'>,
	target: Target,
	ignored: Set<string>
): Requirement[] {
	const lines: Requirement[] = [];
	const fractions = readMap(profile.fractions, 'profile.fractions', 'element', 'Mass fraction');
	const sum = Object.values(fractions).reduce((a, b) => a + b, 0);
	if (sum > 1 + 1e-9)
		fail(
			`Mass fractions add up to ${sum.toFixed(4)}, more than 1 g per g dry biomass`,
			'profile.fractions'
		);
	const statements = readElementStatements(
		profile.elements,
		'profile.elements',
		new Set(Object.keys(fractions))
	);
	const x = requireBiomass(target, 'An elemental profile');
	for (const [el, f] of Object.entries(fractions)) {
		if (ignored.has(el)) continue;
		if (f === 0) continue;
		lines.push({
			key: el,
			basis: 'element',
			demandGPerL: x * f,
			molarMassGPerMol: ATOMIC_WEIGHTS[el],
			...elementStanding(el, statements[el])
		});
	}
	return lines;
}

/** Demand of each component from its g per g dry biomass. */
function requirementsPerGram(
	profile: ProfileOf<'componentRequirements'>,
	target: Target
): Requirement[] {
	const lines: Requirement[] = [];
	const reqs = readMap(
		profile.requirementsGPerG,
		'profile.requirementsGPerG',
		'component',
		'Requirement'
	);
	const x = requireBiomass(target, 'A per-g-biomass profile');
	for (const [key, r] of Object.entries(reqs)) {
		if (r === 0) continue;
		lines.push({
			key,
			basis: 'component',
			demandGPerL: x * r,
			molarMassGPerMol: null,
			...requiredStanding({}, 'profile')
		});
	}
	return lines;
}

/** Demand from per-cell consumption (pg per cell or mmol per 10^9 cells) at the target cell density. */
function requirementsPerCell(
	profile: ProfileOf<'perCell'>,
	target: Target,
	ignored: Set<string>
): Requirement[] {
	if (!Array.isArray(profile.consumption) || profile.consumption.length === 0) {
		fail('A per-cell profile needs a consumption list', 'profile.consumption');
	}
	if (target.cellsPerMl === null) {
		fail(
			'A per-cell profile needs the target in cells/mL, or a cell dry mass to convert g/L',
			'target'
		);
	}
	const cells = target.cellsPerMl;
	const elementKeys = new Set(
		profile.consumption
			.filter((c) => c !== null && typeof c === 'object' && c.basis === 'element')
			.map((c) => c.key)
	);
	const statements = readElementStatements(profile.elements, 'profile.elements', elementKeys);
	const lines: Requirement[] = [];
	profile.consumption.forEach((c, i) => {
		const line = readConsumption(c, `profile.consumption.${i}`, cells, statements, ignored);
		if (line !== null) lines.push(line);
	});
	return lines;
}

/** One consumption entry as a requirement; null when its element is ignored or it needs nothing. */
function readConsumption(
	c: PerCellConsumption,
	field: string,
	cells: number,
	statements: ElementStatements,
	ignored: Set<string>
): Requirement | null {
	if (c === null || typeof c !== 'object' || typeof c.key !== 'string' || c.key === '') {
		fail('Each consumption entry needs a key', `${field}.key`);
	}
	if (c.basis !== 'element' && c.basis !== 'component')
		fail("Basis must be 'element' or 'component'", `${field}.basis`);
	if (c.basis === 'element') requireElement(c.key, `${field}.key`);
	if (c.basis === 'element' && ignored.has(c.key)) return null;
	let molarMass: number | null = null;
	if (c.basis === 'element') molarMass = ATOMIC_WEIGHTS[c.key];
	else if (c.molarMassGPerMol !== undefined)
		molarMass = readPositive(c.molarMassGPerMol, `${field}.molarMassGPerMol`, 'Molar mass');
	else if (c.formula !== undefined) {
		try {
			molarMass = formulaMolarMass(c.formula);
		} catch (e) {
			if (e instanceof ChemistryInputError)
				fail(`Formula of '${c.key}': ${e.message}`, `${field}.formula`);
			throw e;
		}
	}
	const hasPg = c.pgPerCell !== undefined;
	const hasMmol = c.mmolPer1e9Cells !== undefined;
	if (hasPg === hasMmol) fail('Give exactly one of pgPerCell or mmolPer1e9Cells', field);
	let demandGPerL: number;
	if (hasPg) {
		demandGPerL =
			cells *
			readNonNegative(c.pgPerCell, `${field}.pgPerCell`, 'Consumption') *
			G_PER_L_PER_CELL_PER_ML_PER_PG;
	} else {
		if (molarMass === null)
			fail(
				`'${c.key}' in mmol per 10^9 cells needs molarMassGPerMol or formula`,
				`${field}.molarMassGPerMol`
			);
		const q = readNonNegative(c.mmolPer1e9Cells, `${field}.mmolPer1e9Cells`, 'Consumption');
		// cells/mL × 1e3 mL/L ÷ 1e9 × mmol = mmol/L; × g/mol ÷ 1e3 = g/L
		demandGPerL = ((cells * 1e3) / 1e9) * q * (molarMass / 1e3);
	}
	if (!(demandGPerL > 0)) return null;
	return {
		key: c.key,
		basis: c.basis,
		demandGPerL,
		molarMassGPerMol: molarMass,
		...(c.basis === 'element'
			? elementStanding(c.key, statements[c.key])
			: requiredStanding({}, field))
	};
}

export function applyCarbon(
	lines: Requirement[],
	carbon: unknown,
	profile: Exclude<OrganismProfile, { kind: 'preset' }>,
	target: Target,
	notes: string[]
): Requirement[] {
	const carbonLine = lines.find((l) => l.basis === 'element' && l.key === 'C');
	if (carbon === undefined) {
		if (carbonLine) {
			carbonLine.note =
				'Counts only the carbon built into biomass; respired carbon is not included. Give a yield on the carbon source for a realistic demand.';
		}
		return lines;
	}
	if (carbon === null || typeof carbon !== 'object')
		fail('Carbon must be { basis, ... } with a yield', 'carbon');
	const spec = carbon as CarbonDemand;
	const x = requireBiomass(target, 'A carbon yield');
	if (spec.basis === 'component') {
		if (typeof spec.component !== 'string' || spec.component === '')
			fail('Carbon source component id is needed', 'carbon.component');
		const y = readPositive(spec.yieldGPerG, 'carbon.yieldGPerG', 'Yield on the carbon source');
		const rest = lines.filter(
			(l) =>
				!(l.basis === 'element' && l.key === 'C') &&
				!(l.basis === 'component' && l.key === spec.component)
		);
		if (carbonLine)
			notes.push(
				`Carbon is assessed as ${spec.component} at Yx/s = ${y} g/g, which includes respired carbon; the element-C line is replaced.`
			);
		return [
			{
				key: spec.component,
				basis: 'component',
				demandGPerL: x / y,
				molarMassGPerMol: null,
				note: `X / Yx/s with Yx/s = ${y} g/g: includes the carbon respired to CO2`,
				...requiredStanding(spec, 'carbon')
			},
			...rest
		];
	}
	if (spec.basis === 'element') {
		const y = readPositive(spec.yieldGPerGCarbon, 'carbon.yieldGPerGCarbon', 'Yield on carbon');
		const fC = profile.kind === 'elementalFractions' ? profile.fractions.C : undefined;
		if (fC !== undefined && fC > 0 && y > 1 / fC) {
			fail(
				`Yield ${y} g biomass per g C is more than 1/f_C = ${(1 / fC).toFixed(3)}: the cells would hold more carbon than they take up`,
				'carbon.yieldGPerGCarbon'
			);
		}
		const rest = lines.filter((l) => !(l.basis === 'element' && l.key === 'C'));
		return [
			{
				key: 'C',
				basis: 'element',
				demandGPerL: x / y,
				molarMassGPerMol: ATOMIC_WEIGHTS.C,
				note: `X / Yx/C with Yx/C = ${y} g per g C: includes the carbon respired to CO2`,
				...requiredStanding(spec, 'carbon')
			},
			...rest
		];
	}
	fail("Carbon basis must be 'component' or 'element'", 'carbon.basis');
}

export function applySubstrates(
	lines: Requirement[],
	substrates: unknown,
	target: Target
): Requirement[] {
	if (substrates === undefined) return lines;
	if (!Array.isArray(substrates))
		fail('substrates must be a list of { component, yieldGPerG }', 'substrates');
	if (substrates.length === 0) return lines;
	const x = requireBiomass(target, 'A yield on a substrate');
	const seen = new Set<string>();
	const added: Requirement[] = substrates.map((entry: unknown, i) => {
		const field = `substrates.${i}`;
		if (entry === null || typeof entry !== 'object')
			fail('Each substrate needs { component, yieldGPerG }', field);
		const { component, yieldGPerG, note, confidence, source } = entry as SubstrateDemand;
		if (typeof component !== 'string' || component === '')
			fail('Substrate component id is needed', `${field}.component`);
		if (seen.has(component))
			fail(`${component} is listed twice among the substrates`, `${field}.component`);
		seen.add(component);
		const y = readPositive(yieldGPerG, `${field}.yieldGPerG`, `Yield on ${component}`);
		return {
			key: component,
			basis: 'component' as const,
			demandGPerL: x / y,
			molarMassGPerMol: null,
			note: note ?? `X / Yx/s with Yx/s = ${y} g/g`,
			...requiredStanding({ confidence, source }, field)
		};
	});
	return [...lines.filter((l) => !(l.basis === 'component' && seen.has(l.key))), ...added];
}

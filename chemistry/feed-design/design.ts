// The feed designer's linear program: variables, limits and the solve (see ./design-feeds.ts).
import solver from 'javascript-lp-solver';
import { ChemistryInputError } from '../errors';
import {
	type FeedNeed,
	type FeedDesignInput,
	LIMIT_MARGIN,
	NEUTRAL_IN_CATION_FEED_COST,
	type Prepared,
	type Slot,
	type Limits,
	type Volume,
	type LpSolution
} from './types';
import { prepare, checkInput } from './prepare';

export class Design {
	readonly prepared: Prepared[];
	readonly needs: FeedNeed[];

	constructor(readonly input: FeedDesignInput) {
		checkInput(input);
		const seen = new Map<string, number>();
		this.prepared = input.candidates.map((c, i) => {
			const p = prepare(c, i, input.temperatureC);
			const earlier = seen.get(p.spec.id);
			if (earlier !== undefined)
				throw new ChemistryInputError(`${p.spec.name} is already candidate ${earlier + 1}`, {
					field: `candidates.${i}`
				});
			seen.set(p.spec.id, i);
			return p;
		});
		this.needs = input.needs.filter((n) => n.requiredGPerLFinal > 0);
	}

	neededGAt(need: FeedNeed, feedVolumeL: number): number {
		return need.requiredGPerLFinal * (this.input.initialVolumeL + feedVolumeL) - need.presentG;
	}

	limits(kind: 'solubility' | 'osmolality' | 'all'): Limits {
		return {
			osmolality: kind === 'solubility' ? null : this.input.osmolalityMaxMOsmPerKg,
			solids: kind === 'all' ? this.input.dissolvedSolidsMaxGPerL : null
		};
	}

	/** The linear program over the slots' masses (mg) and volumes (L). */
	solve(
		slots: Slot[],
		volume: Volume,
		limits: Limits,
		objective: 'mass' | 'osmoles' | 'solids' | 'volume' | 'maxVolume'
	): LpSolution | null {
		const keep = 1 - LIMIT_MARGIN;
		const constraints: Record<string, { min?: number; max?: number; equal?: number }> = {};
		const variables: Record<string, Record<string, number>> = {};
		const fixed = 'fixedL' in volume;
		this.needs.forEach((need, i) => {
			if (fixed) {
				const neededG = this.neededGAt(need, volume.fixedL);
				if (neededG > 0) constraints[`need${i}`] = { min: neededG * 1000 };
			} else constraints[`need${i}`] = { min: this.neededGAt(need, 0) * 1000 };
		});
		if (fixed) constraints.volume = { equal: volume.fixedL };
		else if (volume.maxL !== null) constraints.volume = { max: volume.maxL };
		slots.forEach((slot, s) => {
			const v: Record<string, number> = {
				volume: 1,
				cost: objective === 'volume' ? 1 : objective === 'maxVolume' ? -1 : 0
			};
			if (!fixed)
				this.needs.forEach((need, i) => (v[`need${i}`] = -need.requiredGPerLFinal * 1000));
			if (limits.osmolality !== null) {
				constraints[`osm${s}`] = { max: 0 };
				v[`osm${s}`] = -limits.osmolality * keep * 1000;
			}
			if (limits.solids !== null) {
				constraints[`solids${s}`] = { max: 0 };
				v[`solids${s}`] = -limits.solids * keep * 1000;
			}
			for (const j of slot.members) {
				const p = this.prepared[j];
				const m: Record<string, number> = {};
				if (objective === 'mass')
					m.cost =
						1 + (slot.key === 'cations' && p.side === 'neutral' ? NEUTRAL_IN_CATION_FEED_COST : 0);
				else if (objective === 'osmoles') m.cost = p.osmolalityPerGPerL;
				else if (objective === 'solids') m.cost = 1;
				// A whisper of mass cost keeps the masses from wandering when only the volume counts.
				else m.cost = 1e-9;
				this.needs.forEach((need, i) => {
					const a = p.content.get(need.key);
					if (a) m[`need${i}`] = a;
				});
				if (p.solubilityGPerL !== null) {
					constraints[`sol${s}_${j}`] = { max: 0 };
					m[`sol${s}_${j}`] = 1;
					v[`sol${s}_${j}`] = -p.solubilityGPerL * keep * 1000;
				}
				if (limits.osmolality !== null) m[`osm${s}`] = p.osmolalityPerGPerL;
				if (limits.solids !== null) m[`solids${s}`] = 1;
				variables[`m${s}_${j}`] = m;
			}
			variables[`v${s}`] = v;
		});
		const result = solver.Solve({ optimize: 'cost', opType: 'min', constraints, variables }) as {
			feasible: boolean;
			bounded?: boolean;
			[k: string]: number | boolean | undefined;
		};
		if (!result.feasible || result.bounded === false) return null;
		const value = (name: string) => Math.max(0, Number(result[name] ?? 0));
		return {
			massMg: slots.map((slot, s) =>
				this.prepared.map((_, j) => (slot.members.includes(j) ? value(`m${s}_${j}`) : 0))
			),
			volumeL: slots.map((_, s) => value(`v${s}`))
		};
	}
}

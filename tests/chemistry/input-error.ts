import { ChemistryInputError } from '../../chemistry/errors';

/** Runs `fn` and returns the ChemistryInputError it throws; any other outcome fails the test. */
export function errorOf(fn: () => unknown): ChemistryInputError {
	try {
		fn();
	} catch (e) {
		if (e instanceof ChemistryInputError) return e;
		throw e;
	}
	throw new Error('expected a ChemistryInputError');
}

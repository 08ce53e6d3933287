import { ChemistryInputError } from '../errors';

/**
 * Bad input that is the study's stored data (its profile, vessel, feeds or plan) rather than what a
 * request asked for: the app answers it as 422, a plain `ChemistryInputError` as 400.
 */
export class StudyDataError extends ChemistryInputError {
	constructor(message: string, options: { field?: string } = {}) {
		super(message, options);
		this.name = 'StudyDataError';
	}
}

/** Runs science on the study's own data: its bad-input errors are the data's (`StudyDataError`), field kept. */
export function asStudyDataError<T>(run: () => T): T {
	try {
		return run();
	} catch (cause) {
		if (cause instanceof ChemistryInputError && !(cause instanceof StudyDataError))
			throw new StudyDataError(cause.message, { field: cause.field });
		throw cause;
	}
}

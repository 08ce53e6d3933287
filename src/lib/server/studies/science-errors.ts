import { ChemistryInputError, StudyDataError } from '$chemistry';
import { RuleError } from '../rule-error';

/**
 * Runs study science and answers its bad input as a rule error at the field the science named: the
 * study's own stored data (`StudyDataError`) is a 422, anything the request asked for a 400.
 */
export function withStudyRuleErrors<T>(run: () => T): T {
	try {
		return run();
	} catch (cause) {
		if (cause instanceof StudyDataError)
			throw new RuleError(cause.message, { field: cause.field, status: 422 });
		if (cause instanceof ChemistryInputError)
			throw new RuleError(cause.message, { field: cause.field, status: 400 });
		throw cause;
	}
}

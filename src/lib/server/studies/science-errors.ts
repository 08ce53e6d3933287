import { ChemistryInputError, StudyDataError } from '$chemistry';
import { RuleError } from '../rule-error';

/**
 * Study science's bad input as a rule error at the field the science named: the study's own stored
 * data (`StudyDataError`) is a 422, anything the request asked for a 400. Anything else as it is.
 */
export function studyRuleError(cause: unknown): unknown {
	if (cause instanceof StudyDataError)
		return new RuleError(cause.message, { field: cause.field, status: 422 });
	if (cause instanceof ChemistryInputError)
		return new RuleError(cause.message, { field: cause.field, status: 400 });
	return cause;
}

/** Runs study science, answering its bad input as `studyRuleError` says. */
export function withStudyRuleErrors<T>(run: () => T): T {
	try {
		return run();
	} catch (cause) {
		throw studyRuleError(cause);
	}
}

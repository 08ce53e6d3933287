import type { StudyReport, WhatIf } from '$chemistry';
import { runInPool } from '../simulation-pool';
import { studyRuleError } from './science-errors';
import type { StudyInputs } from './types';

/**
 * The study report from loaded data and the what-if (the science is `evaluateStudy` in
 * chemistry/study), made in the worker pool: it runs the plan's simulations. Its bad input answers as
 * a `RuleError` at the field, 422 when the study's own data is at fault, and so does a run past the
 * site's time limit.
 */
export async function evaluateStudy(
	inputs: StudyInputs,
	whatIf: WhatIf = {}
): Promise<StudyReport> {
	try {
		return await runInPool('study', { inputs, whatIf });
	} catch (cause) {
		throw studyRuleError(cause);
	}
}

import { evaluateStudy as evaluateStudyScience, type StudyReport, type WhatIf } from '$chemistry';
import { withStudyRuleErrors } from './science-errors';
import type { StudyInputs } from './types';

/**
 * The study report from loaded data and the what-if (the science is `evaluateStudy` in
 * chemistry/study); its bad input answers as a `RuleError` at the field, 422 when the study's own data is at fault.
 */
export function evaluateStudy(inputs: StudyInputs, whatIf: WhatIf = {}): StudyReport {
	return withStudyRuleErrors(() => evaluateStudyScience(inputs, whatIf));
}

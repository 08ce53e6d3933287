// What the analysis warns about on a version, as the signer must see and answer it: each warning
// needs an acknowledgement with a comment before the version is signed, and the acknowledgements
// are written into the signature itself (its comment, in the signatures' hash chain).
import { createHash } from 'node:crypto';
import { RuleError } from '../rule-error';
import { analyseVersion, type RecipeAnalysis } from './analysis';

export type OpenWarningKind = 'solubility' | 'precipitation' | 'osmolality';

export interface OpenWarning {
	/** Stable for the same warning text, so an answer given on the form finds its warning. */
	key: string;
	kind: OpenWarningKind;
	message: string;
}

const keyOf = (kind: string, message: string) =>
	createHash('sha256').update(`${kind}\n${message}`).digest('hex').slice(0, 16);

type Version = Parameters<typeof analyseVersion>[0];

/** Solubility and precipitation warnings, and an osmolality estimate outside the version's range. */
export function openWarnings(version: Version): OpenWarning[] {
	try {
		return warningsOf(analyseVersion(version));
	} catch (cause) {
		if (cause instanceof RuleError) return [];
		throw cause;
	}
}

/** The same, from an analysis already made (a version page has one). */
export function warningsOf(analysis: RecipeAnalysis): OpenWarning[] {
	const warnings: OpenWarning[] = analysis.warnings.map((w) => ({
		key: keyOf(w.kind, w.message),
		kind: w.kind,
		message: w.message
	}));
	const o = analysis.osmolality;
	if (o.verdict === 'below' || o.verdict === 'above') {
		const message = `The osmolality estimate, ${Math.round(o.estimateMOsmPerKg)} mOsm/kg, is ${o.verdict} the version’s range of ${o.minMOsmPerKg ?? '…'}–${o.maxMOsmPerKg ?? '…'} mOsm/kg.`;
		warnings.push({ key: keyOf('osmolality', message), kind: 'osmolality', message });
	}
	return warnings;
}

export const ACKNOWLEDGEMENT_FIELD = 'ack';

/**
 * Every open warning answered with a comment, or a refusal naming each one left unanswered (at its
 * own field, `ack.<key>`). The answers are returned in the warnings' order.
 */
export function checkAcknowledgements(
	warnings: OpenWarning[],
	answers: Record<string, string>
): { warning: OpenWarning; comment: string }[] {
	const missing = warnings.filter((w) => !answers[w.key]?.trim());
	if (missing.length) {
		const fieldErrors = Object.fromEntries(
			missing.map((w) => [
				`${ACKNOWLEDGEMENT_FIELD}.${w.key}`,
				['Say why this is acceptable before signing.']
			])
		);
		throw new RuleError(
			missing.length === 1
				? 'One warning is not acknowledged: say why it is acceptable, then sign.'
				: `${missing.length} warnings are not acknowledged: say for each why it is acceptable, then sign.`,
			{ field: `${ACKNOWLEDGEMENT_FIELD}.${missing[0].key}`, fieldErrors }
		);
	}
	return warnings.map((warning) => ({ warning, comment: answers[warning.key].trim() }));
}

/** The signature's comment: the signer's own words, then each warning with its acknowledgement. */
export function signedComment(
	comment: string,
	acknowledged: { warning: OpenWarning; comment: string }[]
): string {
	const parts = [comment.trim()];
	if (acknowledged.length)
		parts.push(
			[
				'Warnings acknowledged:',
				...acknowledged.map((a) => `- ${a.warning.message} Acknowledged: ${a.comment}`)
			].join('\n')
		);
	return parts.filter(Boolean).join('\n\n');
}

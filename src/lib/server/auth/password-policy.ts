import { ZxcvbnFactory } from '@zxcvbn-ts/core';
import * as commonPackage from '@zxcvbn-ts/language-common';
import * as englishPackage from '@zxcvbn-ts/language-en';

export const MIN_PASSWORD_LENGTH = 12;
export const MAX_PASSWORD_LENGTH = 256;
/** zxcvbn's scale runs 0–4; 3 is "safely unguessable" against an offline attack on a slow hash. */
export const MIN_PASSWORD_SCORE = 3;

let estimator: ZxcvbnFactory | undefined;

// Built on first use: the dictionaries are large and most requests never set a password.
function strengthEstimator(): ZxcvbnFactory {
	estimator ??= new ZxcvbnFactory({
		dictionary: { ...commonPackage.dictionary, ...englishPackage.dictionary },
		graphs: commonPackage.adjacencyGraphs,
		translations: englishPackage.translations
	});
	return estimator;
}

/** The parts of a person's name and e-mail address, which make a password easy to guess. */
function personalWords(personal: string[]): string[] {
	return personal.flatMap((text) => text.toLowerCase().split(/[^\p{L}\p{N}]+/u)).filter(Boolean);
}

/**
 * Returns what is wrong with a new password, or null when it is acceptable. `personal` holds the
 * person's own name and e-mail address: a password built from them scores lower.
 */
export function checkPasswordPolicy(password: string, personal: string[] = []): string | null {
	if (password.length < MIN_PASSWORD_LENGTH) {
		return `Use at least ${MIN_PASSWORD_LENGTH} characters (this one has ${password.length}).`;
	}
	if (password.length > MAX_PASSWORD_LENGTH)
		return `Use at most ${MAX_PASSWORD_LENGTH} characters.`;
	const { score, feedback } = strengthEstimator().check(password, personalWords(personal));
	if (score >= MIN_PASSWORD_SCORE) return null;
	const reasons = [feedback.warning, ...feedback.suggestions].filter(Boolean).join(' ');
	return `This password is too easy to guess (strength ${score} of 4; ${MIN_PASSWORD_SCORE} is needed). ${
		reasons || 'Add more words that are less common.'
	}`;
}

import { REFERENCE_COMPONENTS } from '$chemistry';

let known: Readonly<Record<string, string>> | undefined;

/** GHS statement texts by code, as the reference library gives them (UN GHS, Annex 3). */
export function knownHazardTexts(): Readonly<Record<string, string>> {
	known ??= Object.freeze(
		Object.fromEntries(
			REFERENCE_COMPONENTS.flatMap((c) => (c.ghsHazards ?? []).map((h) => [h.code, h.text]))
		)
	);
	return known;
}

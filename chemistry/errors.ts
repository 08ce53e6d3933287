/**
 * An input the science cannot work with. `field` is the dotted path of the offending input
 * (so an API can answer with a field path), `position` a 0-based character offset where relevant.
 */
export class ChemistryInputError extends Error {
	readonly field?: string;
	readonly position?: number;

	constructor(message: string, options: { field?: string; position?: number } = {}) {
		super(message);
		this.name = 'ChemistryInputError';
		this.field = options.field;
		this.position = options.position;
	}
}

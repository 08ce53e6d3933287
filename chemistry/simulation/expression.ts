import { all, create, type EvalFunction, type MathNode } from 'mathjs';
import { ChemistryInputError } from '../errors';

/** The names a feed expression may read: time in hours and the culture's states. */
export const FEED_EXPRESSION_VARIABLES = ['t', 'X', 'S', 'P', 'V', 'DO', 'C'] as const;
export type FeedExpressionVariable = (typeof FEED_EXPRESSION_VARIABLES)[number];

const CONSTANTS = new Set(['pi', 'e']);

const FUNCTIONS = new Set([
	'abs',
	'sqrt',
	'cbrt',
	'exp',
	'expm1',
	'log',
	'log10',
	'log2',
	'log1p',
	'pow',
	'min',
	'max',
	'floor',
	'ceil',
	'round',
	'sign',
	'mod',
	'sin',
	'cos',
	'tan',
	'asin',
	'acos',
	'atan',
	'atan2',
	'sinh',
	'cosh',
	'tanh'
]);

const OPERATORS = new Set([
	'add',
	'subtract',
	'multiply',
	'divide',
	'pow',
	'mod',
	'unaryMinus',
	'unaryPlus',
	'larger',
	'smaller',
	'largerEq',
	'smallerEq',
	'equal',
	'unequal',
	'and',
	'or',
	'not',
	'xor'
]);

// A private instance, so nothing here can change the functions other modules see. The functions
// that could reach outside an arithmetic expression are disabled as well, in case a check below
// were ever loosened.
const math = create(all, { number: 'number' });
const parse = math.parse;
const refuse = () => {
	throw new Error('disabled in feed expressions');
};
math.import(
	{
		import: refuse,
		createUnit: refuse,
		evaluate: refuse,
		parse: refuse,
		simplify: refuse,
		derivative: refuse,
		compile: refuse
	},
	{ override: true }
);

export interface FeedExpression {
	source: string;
	evaluate(scope: Record<FeedExpressionVariable, number>): number;
}

/**
 * Parses a feed-rate expression and allows only arithmetic on numbers, the listed math functions,
 * comparisons, `a ? b : c`, and the variables t, X, S, P, V, DO, C. The check walks the parse tree
 * before anything is compiled, so a refused expression never runs.
 */
export function compileFeedExpression(source: string, field = 'feed.expression'): FeedExpression {
	if (typeof source !== 'string' || source.trim() === '') {
		throw new ChemistryInputError('The feed expression is empty.', { field });
	}
	if (source.length > 2000) {
		throw new ChemistryInputError('The feed expression is longer than 2000 characters.', { field });
	}
	let root: MathNode;
	try {
		root = parse(source);
	} catch (error) {
		const position = (error as { char?: number }).char;
		throw new ChemistryInputError(
			`The feed expression cannot be read: ${(error as Error).message}.`,
			position === undefined ? { field } : { field, position: Math.max(0, position - 1) }
		);
	}
	checkNode(root, field);
	const compiled: EvalFunction = root.compile();
	return {
		source,
		evaluate(scope) {
			const value: unknown = compiled.evaluate(scope);
			if (typeof value === 'boolean') return value ? 1 : 0;
			if (typeof value !== 'number') {
				throw new ChemistryInputError('The feed expression must give a number.', { field });
			}
			return value;
		}
	};
}

function checkNode(node: MathNode, field: string): void {
	switch (node.type) {
		case 'ConstantNode': {
			const value = (node as unknown as { value: unknown }).value;
			if (typeof value !== 'number') {
				throw new ChemistryInputError(
					`Only numbers are allowed as constants in the feed expression, not ${JSON.stringify(value)}.`,
					{ field }
				);
			}
			return;
		}
		case 'SymbolNode': {
			const name = (node as unknown as { name: string }).name;
			if ((FEED_EXPRESSION_VARIABLES as readonly string[]).includes(name) || CONSTANTS.has(name))
				return;
			throw new ChemistryInputError(
				`Unknown name "${name}" in the feed expression; it may use t, X, S, P, V, DO (or C), pi and e.`,
				{ field }
			);
		}
		case 'ParenthesisNode':
			checkNode((node as unknown as { content: MathNode }).content, field);
			return;
		case 'OperatorNode': {
			const { fn, op, args } = node as unknown as { fn: string; op: string; args: MathNode[] };
			if (!OPERATORS.has(fn)) {
				throw new ChemistryInputError(
					`The operator "${op}" is not allowed in the feed expression.`,
					{
						field
					}
				);
			}
			for (const arg of args) checkNode(arg, field);
			return;
		}
		case 'ConditionalNode': {
			const c = node as unknown as { condition: MathNode; trueExpr: MathNode; falseExpr: MathNode };
			checkNode(c.condition, field);
			checkNode(c.trueExpr, field);
			checkNode(c.falseExpr, field);
			return;
		}
		case 'FunctionNode': {
			const { fn, args } = node as unknown as { fn: MathNode; args: MathNode[] };
			const name = fn.type === 'SymbolNode' ? (fn as unknown as { name: string }).name : null;
			if (name === null || !FUNCTIONS.has(name)) {
				throw new ChemistryInputError(
					`The function "${name ?? fn.toString()}" is not allowed in the feed expression; allowed: ${[...FUNCTIONS].join(', ')}.`,
					{ field }
				);
			}
			for (const arg of args) checkNode(arg, field);
			return;
		}
		case 'AssignmentNode':
			throw new ChemistryInputError('The feed expression may not assign variables.', { field });
		case 'FunctionAssignmentNode':
			throw new ChemistryInputError('The feed expression may not define functions.', { field });
		case 'BlockNode':
			throw new ChemistryInputError(
				'The feed expression must be a single expression (no ";" or new lines).',
				{
					field
				}
			);
		default:
			throw new ChemistryInputError(
				`The feed expression may not contain ${describeNode(node.type)}; only arithmetic on t and the states is allowed.`,
				{ field }
			);
	}
}

function describeNode(type: string): string {
	switch (type) {
		case 'AccessorNode':
		case 'IndexNode':
			return 'property or index access';
		case 'ArrayNode':
			return 'arrays';
		case 'ObjectNode':
			return 'objects';
		case 'RangeNode':
			return 'ranges';
		default:
			return `a ${type}`;
	}
}

import { readDecimalText } from '$lib/number-reading';
import { z } from 'zod';

const isBlank = (v: unknown) =>
	v === null || v === undefined || (typeof v === 'string' && v.trim() === '');

/**
 * A typed number read by the one rule, then checked against the bounds; the reader's own reason
 * (ambiguous, a decimal comma at a point site, not a number) is the message. Blank is undefined.
 */
function typedNumber(label: string, b: Bounds) {
	return z.preprocess((v, ctx) => {
		if (isBlank(v)) return undefined;
		if (typeof v === 'number') return v;
		const read =
			typeof v === 'string'
				? readDecimalText(v, label)
				: { ok: false as const, message: `${label}: enter a number` };
		if (read.ok) return read.value;
		ctx.addIssue({ code: 'custom', message: read.message });
		return z.NEVER;
	}, bounded(label, b).optional());
}

interface Bounds {
	min?: number;
	gt?: number;
	max?: number;
	unit?: string;
}

function bounded(label: string, b: Bounds) {
	let schema = z
		.number({ error: `${label}: enter a number` })
		.refine(Number.isFinite, `${label}: enter a number`);
	const unit = b.unit ? ` ${b.unit}` : '';
	if (b.gt !== undefined)
		schema = schema.refine((v) => v > b.gt!, `${label} must be greater than ${b.gt}${unit}`);
	if (b.min !== undefined)
		schema = schema.refine((v) => v >= b.min!, `${label} must be at least ${b.min}${unit}`);
	if (b.max !== undefined)
		schema = schema.refine((v) => v <= b.max!, `${label} must be at most ${b.max}${unit}`);
	return schema;
}

/** A required number typed in a form; '' is "missing", not 0. */
export function requiredNumber(label: string, b: Bounds = {}) {
	return typedNumber(label, b).refine(
		(v) => v !== undefined,
		`${label} is required`
	) as unknown as z.ZodType<number>;
}

/** An optional number typed in a form; '' becomes null. */
export function optionalNumber(label: string, b: Bounds = {}) {
	return typedNumber(label, b).transform((v) => v ?? null);
}

export const requiredText = (label: string, max = 120) =>
	z
		.string({ error: `${label} is required` })
		.trim()
		.min(1, `${label} is required`)
		.max(max, `${label}: at most ${max} characters`);
export const optionalText = (max = 2000) =>
	z
		.string()
		.trim()
		.max(max)
		.optional()
		.transform((v) => v ?? '');
export const checkbox = z.preprocess((v) => v === 'on' || v === 'true' || v === true, z.boolean());

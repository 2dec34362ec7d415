import { AgronomyError, type AgronomyErrorCode } from './errors.js';

function describe(value: unknown): string {
	if (typeof value === 'number') return String(value);
	if (typeof value === 'string') return JSON.stringify(value);
	if (value instanceof Date) return Number.isNaN(value.getTime()) ? 'an invalid date' : value.toISOString();
	if (value === undefined) return 'nothing';
	if (value === null) return 'null';
	if (Array.isArray(value)) return value.length === 0 ? 'an empty list' : `a list of ${value.length}`;
	return typeof value;
}

function withUnit(amount: number, unit: string): string {
	return unit ? `${amount} ${unit}` : String(amount);
}

function fail(code: AgronomyErrorCode, label: string, rule: string, value: unknown): never {
	throw new AgronomyError(code, label, `${label} must be ${rule}; got ${describe(value)}`);
}

/** A finite number (rejects NaN, ±Infinity and non-numbers arriving from untyped callers). */
export function requireFinite(label: string, value: unknown): number {
	if (typeof value !== 'number' || !Number.isFinite(value)) fail('not_finite', label, 'a finite number', value);
	return value;
}

/** A finite number greater than zero. */
export function requirePositive(label: string, value: unknown, unit = ''): number {
	const n = requireFinite(label, value);
	if (n <= 0) fail('not_positive', label, `more than ${withUnit(0, unit)}`, n);
	return n;
}

/** A finite number of zero or more. */
export function requireNonNegative(label: string, value: unknown, unit = ''): number {
	const n = requireFinite(label, value);
	if (n < 0) fail('negative', label, `${withUnit(0, unit)} or more`, n);
	return n;
}

/** A whole number greater than zero (head counts, rows). */
export function requireWholePositive(label: string, value: unknown): number {
	const n = requirePositive(label, value);
	if (!Number.isInteger(n)) fail('not_integer', label, 'a whole number', n);
	return n;
}

/** A whole number of zero or more (calendar days). */
export function requireWholeNonNegative(label: string, value: unknown, unit = ''): number {
	const n = requireNonNegative(label, value, unit);
	if (!Number.isInteger(n)) fail('not_integer', label, 'a whole number', n);
	return n;
}

export interface RangeBounds {
	min: number;
	max: number;
	minInclusive: boolean;
	maxInclusive: boolean;
	unit?: string;
	hint?: string;
}

/** A finite number inside the given bounds; the message spells out which ends are allowed. */
export function requireInRange(label: string, value: unknown, bounds: RangeBounds): number {
	const n = requireFinite(label, value);
	const unit = bounds.unit ?? '';
	const tooLow = bounds.minInclusive ? n < bounds.min : n <= bounds.min;
	const tooHigh = bounds.maxInclusive ? n > bounds.max : n >= bounds.max;
	if (tooLow || tooHigh) {
		const low = `${bounds.minInclusive ? 'at least' : 'more than'} ${withUnit(bounds.min, unit)}`;
		const high = `${bounds.maxInclusive ? 'at most' : 'less than'} ${withUnit(bounds.max, unit)}`;
		fail('out_of_range', label, `${low} and ${high}${bounds.hint ? ` (${bounds.hint})` : ''}`, n);
	}
	return n;
}

/** One of a fixed set of names. */
export function requireOneOf<T extends string>(
	label: string,
	value: unknown,
	allowed: readonly T[],
	code: AgronomyErrorCode
): T {
	if (typeof value !== 'string' || !(allowed as readonly string[]).includes(value)) {
		fail(code, label, `one of ${allowed.join(', ')}`, value);
	}
	return value as T;
}

/** A Date that holds a real instant. */
export function requireDate(label: string, value: unknown): Date {
	if (!(value instanceof Date) || Number.isNaN(value.getTime())) fail('invalid_date', label, 'a valid date', value);
	return value;
}

/** A list with at least one entry. */
export function requireNonEmpty<T>(label: string, value: unknown): readonly T[] {
	if (!Array.isArray(value) || value.length === 0) fail('empty_list', label, 'a list with at least one entry', value);
	return value as readonly T[];
}

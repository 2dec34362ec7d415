/** Every code an agronomy helper can throw with; callers may branch on these. */
export type AgronomyErrorCode =
	| 'not_finite'
	| 'not_positive'
	| 'negative'
	| 'not_integer'
	| 'out_of_range'
	| 'unknown_crop'
	| 'unknown_species'
	| 'invalid_date'
	| 'empty_list'
	| 'missing_interval'
	| 'invalid_time_zone';

/**
 * Thrown when an agronomy helper is given an input it cannot compute with.
 * `message` is written for a person: it names the argument and repeats the bad value.
 * `argument` is the plain name of the offending input (for pointing at a form field).
 */
export class AgronomyError extends Error {
	readonly code: AgronomyErrorCode;
	readonly argument: string;

	constructor(code: AgronomyErrorCode, argument: string, message: string) {
		super(message);
		this.name = 'AgronomyError';
		this.code = code;
		this.argument = argument;
	}
}

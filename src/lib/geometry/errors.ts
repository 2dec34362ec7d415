/** Every reason the geometry engine refuses an input. */
export type GeometryErrorCode =
	| 'invalid-geometry'
	| 'open-ring'
	| 'too-few-positions'
	| 'not-finite'
	| 'out-of-range'
	| 'swapped-coordinates'
	| 'self-intersection'
	| 'zero-area'
	| 'field-too-large'
	| 'too-many-vertices'
	| 'crosses-antimeridian'
	| 'encloses-pole'
	| 'too-many-lanes'
	| 'ab-same-point'
	| 'ab-far-from-field'
	| 'empty-pattern'
	| 'invalid-lane'
	| 'invalid-number'
	| 'nothing-to-plant';

/**
 * Thrown for every input the geometry engine cannot lay out honestly.
 * `code` is stable for programs; `message` is written for the farmer.
 *
 * @example
 * try { layoutStrips(input); } catch (e) { if (e instanceof GeometryError) show(e.message); }
 */
export class GeometryError extends Error {
	readonly code: GeometryErrorCode;
	/** Approximate [lng, lat] of the problem when it has a place (e.g. a boundary crossing). */
	readonly where?: [number, number];

	constructor(code: GeometryErrorCode, message: string, where?: [number, number], cause?: unknown) {
		super(message, cause === undefined ? undefined : { cause });
		this.name = 'GeometryError';
		this.code = code;
		if (where) this.where = where;
	}
}

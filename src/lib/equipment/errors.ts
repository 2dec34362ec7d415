/** Every reason the equipment planner refuses an input; stable for programs to branch on. */
export type EquipmentErrorCode =
	| 'no-row-units'
	| 'no-seed'
	| 'invalid-row-spacing'
	| 'unit-numbering'
	| 'unknown-fertilizer-line'
	| 'invalid-lane'
	| 'invalid-width'
	| 'invalid-option'
	| 'invalid-rate';

/**
 * Thrown when a planter, implement, lane list or option cannot be planned with honestly.
 * `message` is written for the farmer and says what to fix; no half-made sheet is returned.
 *
 * @example
 * try { planPasses(input); } catch (e) { if (e instanceof EquipmentError && e.code === 'no-row-units') askForUnits(); }
 */
export class EquipmentError extends Error {
	readonly code: EquipmentErrorCode;

	constructor(code: EquipmentErrorCode, message: string) {
		super(message);
		this.name = 'EquipmentError';
		this.code = code;
	}
}

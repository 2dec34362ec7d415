import { expect } from 'vitest';
import { AgronomyError } from '../../../src/lib/agronomy/index.js';

/** Runs `fn`, and checks it threw an AgronomyError with exactly this code and message. */
export function expectAgronomyError(fn: () => unknown, code: string, message: string): void {
	let caught: unknown;
	try {
		fn();
	} catch (error) {
		caught = error;
	}
	expect(caught, 'expected an AgronomyError to be thrown').toBeInstanceOf(AgronomyError);
	const error = caught as AgronomyError;
	expect({ code: error.code, message: error.message }).toEqual({ code, message });
}

/** A deep, frozen copy, so a test can both compare and detect writes. */
export function frozenCopy<T>(value: T): T {
	const copy = structuredClone(value);
	const freeze = (v: unknown): void => {
		if (v && typeof v === 'object' && !(v instanceof Date)) {
			Object.values(v).forEach(freeze);
			Object.freeze(v);
		}
	};
	freeze(copy);
	return copy;
}

import { describe, expect, it } from 'vitest';
import { AgronomyError, seedsPerAcre } from '../../../src/lib/agronomy/index.js';

describe('AgronomyError', () => {
	it('is an Error carrying a code, the argument name and a plain message', () => {
		const error = new AgronomyError('not_positive', 'row width', 'row width must be more than 0 in; got -30');
		expect(error).toBeInstanceOf(Error);
		expect(error.name).toBe('AgronomyError');
		expect(error.code).toBe('not_positive');
		expect(error.argument).toBe('row width');
		expect(error.message).toBe('row width must be more than 0 in; got -30');
	});

	it('is what the helpers throw, with the argument named', () => {
		let caught: unknown;
		try {
			seedsPerAcre(-30, 6);
		} catch (error) {
			caught = error;
		}
		expect(caught, 'seedsPerAcre(-30, 6) should throw').toBeInstanceOf(AgronomyError);
		expect((caught as AgronomyError).argument).toBe('row width');
	});

	it('describes values of the wrong type from untyped callers', () => {
		expect(() => seedsPerAcre('30' as unknown as number, 6)).toThrow('row width must be a finite number; got "30"');
		expect(() => seedsPerAcre(undefined as unknown as number, 6)).toThrow(
			'row width must be a finite number; got nothing'
		);
		expect(() => seedsPerAcre(null as unknown as number, 6)).toThrow('row width must be a finite number; got null');
	});
});

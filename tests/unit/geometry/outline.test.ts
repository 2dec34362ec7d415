import { describe, expect, it } from 'vitest';
import type { Polygon } from 'geojson';
import { checkOutline, GeometryError } from '$lib/geometry/index';

function refusal(g: Polygon): GeometryError {
	try {
		checkOutline(g, 'field boundary');
	} catch (e) {
		if (e instanceof GeometryError) return e;
		throw e;
	}
	throw new Error('expected a refusal');
}

describe('checkOutline', () => {
	it('accepts a simple outline with a hole', () => {
		const square: Polygon = { type: 'Polygon', coordinates: [
			[[-94, 44], [-93.99, 44], [-93.99, 44.01], [-94, 44.01], [-94, 44]],
			[[-93.996, 44.004], [-93.996, 44.006], [-93.994, 44.006], [-93.994, 44.004], [-93.996, 44.004]]
		] };
		expect(() => checkOutline(square, 'field boundary')).not.toThrow();
	});
	it('names where a bowtie crosses itself', () => {
		const e = refusal({ type: 'Polygon', coordinates: [[[-94, 44], [-93.99, 44.01], [-93.99, 44], [-94, 44.01], [-94, 44]]] });
		expect(e.code).toBe('self-intersection');
		expect(e.where![0]).toBeCloseTo(-93.995, 6);
		expect(e.where![1]).toBeCloseTo(44.005, 5);
	});
	it('calls a flat outline what it is, not a crossing', () => {
		const e = refusal({ type: 'Polygon', coordinates: [[[-94, 44], [-94, 44.01], [-94, 44.02], [-94, 44]]] });
		expect(e.code).toBe('zero-area');
		expect(e.message).toBe('The field boundary encloses no area (0 acres): its corners lie on one line.');
	});
	it('refuses a hole that crosses the outer ring', () => {
		const e = refusal({ type: 'Polygon', coordinates: [
			[[-94, 44], [-93.99, 44], [-93.99, 44.01], [-94, 44.01], [-94, 44]],
			[[-93.995, 44.005], [-93.985, 44.005], [-93.985, 44.006], [-93.995, 44.006], [-93.995, 44.005]]
		] });
		expect(e.code).toBe('self-intersection');
	});
});

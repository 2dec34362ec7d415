import { describe, expect, it } from 'vitest';
import { isoToLocal, localToIso, readRecordForm } from '$lib/server/record-form';

const form = (values: Record<string, string>) => {
	const f = new FormData();
	for (const [k, v] of Object.entries(values)) f.set(k, v);
	return f;
};

describe('record form', () => {
	it('reads the farm\'s clock with the offset of that day, across the spring clock change', () => {
		expect(localToIso('2026-03-07T20:00', 'America/Chicago')).toBe('2026-03-07T20:00:00.000-06:00');
		expect(localToIso('2026-03-08T20:00', 'America/Chicago')).toBe('2026-03-08T20:00:00.000-05:00');
		expect(localToIso('yesterday', 'America/Chicago')).toBeNull();
		expect(isoToLocal('2026-07-01T19:00:00Z', 'America/Chicago')).toBe('2026-07-01T14:00');
	});

	it('reads lanes as people count them, products and the type-specific facts', () => {
		const read = readRecordForm(
			form({ type: 'planting', startedAt: '2026-05-02T07:30', endedAt: '2026-05-02T18:00', lanes: '1-3, 5', productId_0: '5a1e0000-0000-4000-8000-0000000c0006', rate_0: '5', rateUnit_0: 'gal/ac', variety: 'hybrid A', populationPerAcre: '34,000', depthIn: '2' }),
			33,
			'America/Chicago'
		);
		expect('input' in read).toBe(true);
		if (!('input' in read)) return;
		expect(read.input.laneIndexes).toEqual([0, 1, 2, 4]);
		expect(read.input.startedAt).toBe('2026-05-02T07:30:00.000-05:00');
		expect(read.input.products).toEqual([{ productId: '5a1e0000-0000-4000-8000-0000000c0006', rate: 5, rateUnit: 'gal/ac' }]);
		expect(read.input.details).toMatchObject({ variety: 'hybrid A', populationPerAcre: 34_000, depthIn: 2 });
	});

	it('puts each problem beside its input and keeps what was typed', () => {
		const read = readRecordForm(form({ type: 'spraying', startedAt: '', endedAt: '2026-05-02T18:00', lanes: '40', productId_0: '5a1e0000-0000-4000-8000-0000000c0006', rate_0: '-1', rateUnit_0: 'gal/ac' }), 33, 'America/Chicago');
		expect('failure' in read).toBe(true);
		if (!('failure' in read)) return;
		expect(read.failure.fields.laneIndexes).toEqual(['Lanes run from 1 to 33; "40" is outside that.']);
		expect(read.failure.fields.startedAt).toEqual(['Give the date and time the work started.']);
		expect(read.failure.fields['products.0.rate']).toEqual(['A rate must be more than 0.']);
		expect(read.failure.values.lanes).toBe('40');
	});
});

import { describe, expect, it } from 'vitest';
import { recordChanges } from '$lib/records/history-words';

const TZ = 'America/Chicago';
const base = {
	id: 'r1', version: 1, type: 'spraying', acres: 35.574, laneIndexes: [1, 3, 5], lanes: [{ laneIndex: 1 }], location: 'North 80, lanes 2, 4, 6',
	startedAt: '2026-05-03T13:00:00.000Z', endedAt: '2026-05-03T16:15:00.000Z', applicator: 'Avery', applicatorCertNumber: 'PA-1', equipment: null,
	weather: { tempF: 58, windMph: 6, windFrom: 'NW' }, details: {}, notes: null,
	products: [{ productName: 'post herbicide B', rate: 6, rateUnit: 'fl oz/ac', total: 213.4 }], updatedAt: '2026-05-03T22:15:00.000Z'
};

describe('what an edit of a record changed, in words', () => {
	it('writes weather, times, notes and products with their units, not as data', () => {
		const after = {
			...base, version: 2, updatedAt: '2026-12-03T06:23:50.808Z', notes: 'Boom height checked', weather: { tempF: 72, windMph: 7, windFrom: 'NW' },
			endedAt: '2026-05-03T17:00:00.000Z', products: [{ productName: 'post herbicide B', rate: 8, rateUnit: 'fl oz/ac', total: 284.6 }]
		};
		expect(recordChanges(base, after, TZ)).toEqual([
			'Ended: Sun 3 May 2026, 11:15 → Sun 3 May 2026, 12:00',
			'Weather: 58 °F, wind 6 mph from NW → 72 °F, wind 7 mph from NW',
			'Notes: (blank) → "Boom height checked"',
			'Products: post herbicide B 6 fl oz/ac → post herbicide B 8 fl oz/ac'
		]);
	});

	it('names lanes as people count them, the area in acres, and skips the copies that follow the lanes', () => {
		const after = { ...base, laneIndexes: [1, 2, 3], lanes: [{ laneIndex: 2 }], location: 'North 80, lanes 2–4', acres: 3.5, type: 'fertilizer', details: { depthIn: 2, placement: 'side-dress' } };
		expect(recordChanges(base, after, TZ)).toEqual([
			'Type of work: Spraying → Fertilizer',
			'Area: 35.57 ac → 3.5 ac',
			'Lanes: lanes 2, 4, 6 → lanes 2–4',
			'Details: (blank) → depth 2 in, placement side-dress'
		]);
	});

	it('answers nothing for a delete or restore entry without both sides', () => {
		expect(recordChanges(base, null, TZ)).toEqual([]);
	});
});

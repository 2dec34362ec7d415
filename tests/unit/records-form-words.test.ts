import { describe, expect, it } from 'vitest';
import { readRecordForm } from '$lib/server/record-form';

const form = (values: Record<string, string>) => {
	const f = new FormData();
	for (const [k, v] of Object.entries(values)) f.set(k, v);
	return f;
};

describe('record form messages for words typed in number boxes', () => {
	it('names the field and its unit instead of the parser\'s words', () => {
		const read = readRecordForm(
			form({ type: 'mowing', startedAt: '2026-07-08T08:00', endedAt: '2026-07-08T11:00', lanes: '1-3', tempF: 'hot', windMph: 'calm', heightIn: 'six', depthIn: 'deep' }),
			33,
			'America/Chicago'
		);
		expect('failure' in read).toBe(true);
		if (!('failure' in read)) return;
		const f = read.failure.fields;
		expect(f['weather.tempF']).toEqual(['Temperature (°F) must be a number.']);
		expect(f['weather.windMph']).toEqual(['Wind speed (mph) must be a number.']);
		expect(f['details.heightIn']).toEqual(['Cutting height (in) must be a number.']);
		expect(f['details.depthIn']).toEqual(['Depth (in) must be a number.']);
		expect(JSON.stringify(f)).not.toMatch(/expected number|received NaN|Invalid input/);
	});

	it('says the cutting height limits in inches', () => {
		const read = readRecordForm(
			form({ type: 'mowing', startedAt: '2026-07-08T08:00', endedAt: '2026-07-08T11:00', lanes: '1-3', heightIn: '60' }),
			33,
			'America/Chicago'
		);
		expect('failure' in read && read.failure.fields['details.heightIn']).toEqual(['Over 48 in is not a cutting height.']);
	});
});

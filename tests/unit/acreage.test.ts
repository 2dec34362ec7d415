import { describe, expect, it } from 'vitest';
import {
	acreageCsv,
	buildAcreageReport,
	creditedLaneAcres,
	csvCell,
	dayInZone,
	laneRowSpacingIn,
	NO_LANDLORD,
	type AcreageField,
	type AcreageLane
} from '../../src/lib/reports/acreage';

const crop = (crop: string, rows: number, rowSpacingIn: number, acres: number): AcreageLane => ({ kind: 'crop', crop, rows, widthFt: (rows * rowSpacingIn) / 12, acres });

function field(over: Partial<AcreageField> = {}): AcreageField {
	return {
		fieldId: '00000000-0000-4000-8000-000000000001',
		fieldName: 'Test field',
		farmNumber: '1234',
		tractNumber: '567',
		fieldNumber: '3',
		landlord: null,
		lanes: [],
		plantingStarts: {},
		...over
	};
}

describe('credited acres (7 CFR 718.108: each row credited at most 40 in)', () => {
	// Worked values: 60 in → 0.6667, 72 in → 0.5556, 90 in → 0.4444 of the planted area.
	it.each([
		[60, 0.6667],
		[72, 0.5556],
		[90, 0.4444]
	])('a 10.00 ac lane of %i-in rows counts %f of its acres', (spacing, share) => {
		const lane = crop('corn', 12, spacing, 10);
		expect(laneRowSpacingIn(lane)).toBeCloseTo(spacing, 9);
		expect(creditedLaneAcres(lane)).toBeCloseTo(10 * share, 3);
	});

	it('credits 30-in and 40-in rows in full, and lanes without rows whole', () => {
		expect(creditedLaneAcres(crop('soybean', 8, 30, 3.25))).toBe(3.25);
		expect(creditedLaneAcres(crop('corn', 6, 40, 2))).toBe(2);
		expect(creditedLaneAcres({ kind: 'pasture', crop: 'pasture', rows: 0, widthFt: 10, acres: 1.5 })).toBe(1.5);
		expect(laneRowSpacingIn({ rows: 0, widthFt: 10 })).toBeNull();
	});
});

describe('buildAcreageReport', () => {
	it('sums lanes per field and crop, with totals per crop and per landlord', () => {
		const a = field({
			fieldName: 'Strips',
			landlord: 'Landlord one',
			lanes: [crop('corn', 8, 30, 2.5), crop('soybean', 8, 30, 2.25), crop('corn', 8, 30, 2.125), crop('soybean', 8, 30, 1.0)],
			plantingStarts: { corn: new Date('2027-05-02T14:00:00Z'), soybean: new Date('2027-05-12T04:30:00Z') }
		});
		const b = field({
			fieldId: '00000000-0000-4000-8000-000000000002',
			fieldName: 'Wide rows',
			lanes: [crop('corn', 12, 60, 6), crop('corn', 8, 30, 2)],
			plantingStarts: {}
		});
		const r = buildAcreageReport(2027, [a, b], 'America/Chicago');
		expect(r.rows.map((x) => [x.fieldName, x.crop, x.plantedAcres, x.creditedAcres, x.practice, x.plantingDate])).toEqual([
			['Strips', 'corn', 4.63, 4.63, 'strips', '2027-05-02'],
			// 04:30 UTC on 12 May is still 11 May in Chicago (CDT, UTC−5)
			['Strips', 'soybean', 3.25, 3.25, 'strips', '2027-05-11'],
			['Wide rows', 'corn', 8, 6, 'wide rows', null]
		]);
		expect(r.rows[2].rowSpacingIn).toBe(60);
		expect(r.rows[0].intendedUse).toBe('grain');
		expect(r.totals).toEqual({ corn: { plantedAcres: 12.63, creditedAcres: 10.63 }, soybean: { plantedAcres: 3.25, creditedAcres: 3.25 } });
		expect(r.byLandlord).toEqual({
			'Landlord one': { corn: { plantedAcres: 4.63, creditedAcres: 4.63 }, soybean: { plantedAcres: 3.25, creditedAcres: 3.25 } },
			[NO_LANDLORD]: { corn: { plantedAcres: 8, creditedAcres: 6 } }
		});
		expect(r.warnings).toEqual(['Wide rows: no planting record for corn in 2027; log the planting in the record book so the report carries its date.']);
	});

	it('names pasture lanes as pasture for grazing and never warns about their planting', () => {
		const r = buildAcreageReport(2026, [field({ lanes: [crop('corn', 8, 30, 4), { kind: 'pasture', crop: 'pasture', rows: 0, widthFt: 10, acres: 0.5 }], plantingStarts: { corn: new Date('2026-05-01T15:00:00Z') } })], 'UTC');
		expect(r.rows.map((x) => [x.crop, x.practice, x.intendedUse, x.rowSpacingIn])).toEqual([
			['corn', 'strips', 'grain', 30],
			['pasture', 'pasture', 'grazing', null]
		]);
		expect(r.warnings).toEqual([]);
	});

	it('does not change its input', () => {
		const input = field({ lanes: [crop('corn', 12, 90, 9)] });
		const copy = structuredClone(input);
		buildAcreageReport(2027, [input], 'UTC');
		expect(input).toEqual(copy);
	});
});

describe('acreage CSV', () => {
	it('writes a header, the rows and the crop totals with CRLF line ends', () => {
		const r = buildAcreageReport(2027, [field({ fieldName: 'North, "A"', lanes: [crop('corn', 12, 90, 9)], plantingStarts: { corn: new Date('2027-05-03T12:00:00Z') } })], 'UTC');
		expect(acreageCsv(r).split('\r\n')).toEqual([
			'Farm number,Tract number,Field number,Field,Landlord,Crop,Intended use,Practice,Row spacing (in),Planting date,Planted (ac),Credited (ac)',
			'1234,567,3,"North, ""A""",,corn,grain,wide rows,90,2027-05-03,9,4',
			',,,Total,,corn,,,,,9,4',
			''
		]);
	});

	it('defuses text a spreadsheet would run as a formula', () => {
		expect(csvCell('=SUM(A1)')).toBe("'=SUM(A1)");
		expect(csvCell(-3)).toBe('-3');
	});

	it('gives calendar days in the farm zone', () => {
		expect(dayInZone(new Date('2027-01-01T05:59:00Z'), 'America/Chicago')).toBe('2026-12-31');
		expect(dayInZone(new Date('2027-01-01T06:00:00Z'), 'America/Chicago')).toBe('2027-01-01');
	});
});

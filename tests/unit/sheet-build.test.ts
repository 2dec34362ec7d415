import { describe, expect, it } from 'vitest';
import { layoutStrips, type LaneSpec } from '$lib/geometry/index';
import { buildSheet, condenseChecks, SheetError, type SheetSource } from '$lib/sheet/build';
import type { Equipment, PlanterSetup } from '$lib/equipment/types';
import { rectangle } from '../fixtures/rectangle';


const pattern: LaneSpec[] = [
	{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 },
	{ kind: 'pasture', crop: 'pasture', widthFt: 10 },
	{ kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 },
	{ kind: 'pasture', crop: 'pasture', widthFt: 10 }
];

const nLine = { id: 'n', name: 'Nitrogen (UAN 32 %)', product: 'UAN 32 %', forCrops: ['corn'], gallonsPerAcre: 15, poundsPerGallon: 11.06, percentN: 32 };

function planter(setup: Partial<PlanterSetup> = {}): Equipment {
	const units = Array.from({ length: 16 }, (_, i) => ({
		unit: i + 1,
		seed: i < 8 ? { crop: 'corn', variety: 'hybrid A' } : { crop: 'soybean', variety: 'line 2' },
		fertilizerOn: i < 8 || i === 8 ? ['n'] : []
	}));
	return { id: 'p', name: 'Split planter', kind: 'planter', workingWidthFt: 40, planter: { rowSpacingIn: 30, rowUnits: units, fertilizerLines: [nLine], ...setup }, sections: null, rows: 16, lengthFt: null, notes: null, isDefaultPlanter: true, version: 1 };
}

const drill: Equipment = { id: 'd', name: '15-ft drill', kind: 'drill', workingWidthFt: 15, planter: null, sections: null, rows: null, lengthFt: null, notes: null, isDefaultPlanter: false, version: 1 };

function source(overrides: Partial<SheetSource> = {}): SheetSource {
	const boundary = rectangle(295, 1000, -94.22, 43.91);
	const guidance = { a: boundary.coordinates[0][0] as [number, number], b: boundary.coordinates[0][3] as [number, number] };
	const layout = layoutStrips({ boundary, guidance, pattern, offsetFt: 0, headlandFt: 0 });
	const assignments = layout.lanes.filter((l) => l.kind === 'crop').map((l) => ({ laneIndex: l.index, variety: l.crop === 'corn' ? 'hybrid A' : 'line 2', populationPerAcre: l.crop === 'corn' ? 34_000 : 140_000, relativeMaturity: null, seedLot: null, trialLabel: null, notes: null }));
	const byIndex = new Map(assignments.map((a) => [a.laneIndex, a]));
	return {
		farmName: 'Test farm',
		fieldName: 'Test field',
		preparedBy: 'Tester',
		printedAt: new Date('2027-04-20T13:00:00Z'),
		plan: { season: 2027, variant: 'main', guidance, pattern, headlandFt: 0, fieldAcres: layout.fieldAcres, plantedAcres: layout.plantedAcres, lanes: layout.lanes.map((l) => ({ ...l, assignment: byIndex.get(l.index) ?? null })), assignments },
		outline: { boundary, exclusions: [] },
		planter: planter(),
		otherImplements: [drill],
		...overrides
	};
}

describe('seeding sheet', () => {
	it('lists every lane, plans passes and stops on nitrogen plumbed to a soybean row', () => {
		const sheet = buildSheet(source());
		// 295 ft ÷ 60-ft repeat: 4 whole repeats and a fifth whose last pasture lane is cut to 5 ft.
		expect(sheet.lanes).toHaveLength(20);
		expect(sheet.lanes[0]).toMatchObject({ index: 0, crop: 'corn', widthFt: 20, rows: 8, rowSpacingIn: 30, variety: 'hybrid A', populationPerAcre: 34_000 });
		expect(sheet.equipment?.widthFt).toBe(40);
		expect(sheet.passes.length).toBeGreaterThan(0);
		const stops = sheet.checks.filter((c) => c.severity === 'stop');
		const nitrogen = stops.filter((c) => c.kind === 'fertilizer_wrong_crop');
		// The same misplumbed unit gives one condensed line, not one per pass.
		expect(nitrogen).toHaveLength(1);
		expect(nitrogen[0].unit).toBe(9);
		expect(nitrogen[0].message).toMatch(/^Passes \d+(, \d+)*: Nitrogen \(UAN 32 %\) is on at row unit 9 over lanes? [\d, ]+.*soybean.*meant for corn/);
		expect(sheet.checks.indexOf(nitrogen[0])).toBeLessThan(sheet.checks.findIndex((c) => c.severity === 'warn'));
		// Arithmetic: a 15-ft drill centred in a 10-ft pasture lane overhangs (15 − 10) ÷ 2 ft = 30 in each side.
		expect(sheet.checks.some((c) => c.severity === 'warn' && /\b15-ft drill\b/.test(c.message) && /\b30 in\b/.test(c.message))).toBe(true);
		expect(sheet.hazards.some((h) => /\bpasture lanes 2, 4, 6\b/.test(h))).toBe(true);
		expect(sheet.cautions[0]).toMatch(/^The label is the law/);
	});

	it('computes pounds of N from the entered rate: 15 gal/ac of 32 % at 11.06 lb/gal = 53.09 lb N/ac', () => {
		const sheet = buildSheet(source());
		const n = sheet.quantities.find((q) => /UAN 32/.test(q.label));
		expect(n).toBeDefined();
		// lb N/ac = gal/ac × lb/gal × %N ÷ 100 (J. Camberato, "Calculating nitrogen rates from liquid fertilizer
		// products", Purdue University Extension, 2023) → 15 × 11.06 (the farm's entered density) × 0.32 = 53.09.
		expect(`${n!.amount} ${n!.detail}`).toMatch(/\b53\.09 lb N\/ac\b/);
	});

	it('without a planter still lists lanes, widths, crops and acres, and says so', () => {
		const sheet = buildSheet(source({ planter: null }));
		expect(sheet.equipment).toBeNull();
		expect(sheet.passes).toEqual([]);
		expect(sheet.lanes).toHaveLength(20);
		expect(sheet.quantities.find((q) => /^Corn — hybrid A/.test(q.label))?.amount).toMatch(/units/);
	});

	it('a planter with no row units is a STOP, never passes that look valid', () => {
		const sheet = buildSheet(source({ planter: planter({ rowUnits: [] }) }));
		expect(sheet.passes).toEqual([]);
		expect(sheet.checks[0]).toMatchObject({ severity: 'stop' });
		expect(sheet.checks[0].message).toMatch(/^Split planter: The planter has no row units set up/);
	});

	it('a planter whose rows do not match the plan is a STOP', () => {
		const units = Array.from({ length: 12 }, (_, i) => ({ unit: i + 1, seed: { crop: 'corn', variety: null }, fertilizerOn: [] }));
		const sheet = buildSheet(source({ planter: planter({ rowSpacingIn: 20, rowUnits: units, fertilizerLines: [] }) }));
		expect(sheet.checks.some((c) => c.severity === 'stop' && /20 in/.test(c.message) && /30/.test(c.message))).toBe(true);
	});

	it('refuses a plan with no lanes', () => {
		const src = source();
		expect(() => buildSheet({ ...src, plan: { ...src.plan, lanes: [] } })).toThrow(SheetError);
	});

	it('condenses only checks that differ by pass and lane', () => {
		const out = condenseChecks([
			{ severity: 'stop', kind: 'seed_wrong_crop', unit: 3, laneIndex: 0, message: 'Pass 1 (from A): row unit 3 carries corn but runs over lane 1 (soybean). Start this pass from B.' },
			{ severity: 'stop', kind: 'seed_wrong_crop', unit: 3, laneIndex: 4, message: 'Pass 3 (from A): row unit 3 carries corn but runs over lane 5 (soybean). Start this pass from B.' },
			{ severity: 'warn', kind: 'partial_pass', unit: null, laneIndex: null, message: 'Lane 2 is not a whole number of planter widths.' }
		]);
		expect(out.map((c) => c.message)).toEqual([
			'Passes 1, 3: row unit 3 carries corn but runs over lanes 1, 5 (soybean). Start this pass from B.',
			'Lane 2 is not a whole number of planter widths.'
		]);
	});
});

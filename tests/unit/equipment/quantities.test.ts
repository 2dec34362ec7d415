import { describe, expect, it } from 'vitest';
import { NITROGEN_DENSITY_CAUTION } from '../../../src/lib/agronomy/index';
import { EquipmentError, planPasses, seedAndFertilizerQuantities } from '../../../src/lib/equipment/index';
import { toSheetQuantities } from '../../../src/lib/sheet/passes';
import type { Lane, LaneSpec } from '../../../src/lib/geometry/index';
import type { LaneAssignment } from '../../../src/lib/plans/types';
import { corn, corn8, nitrogenLine, planter, rectangleLayout, soy8, soybean, starterLine } from './fixtures';

const corn16: LaneSpec = { kind: 'crop', crop: 'corn', rows: 16, rowSpacingIn: 30 };

function assign(laneIndex: number, variety: string | null, populationPerAcre: number | null): LaneAssignment {
	return { laneIndex, variety, relativeMaturity: null, populationPerAcre, seedLot: null, trialLabel: null, notes: null };
}
const acresOf = (lanes: Lane[], keep: (l: Lane) => boolean) => lanes.filter(keep).reduce((s, l) => s + l.acres, 0);

// 1,320 ft × 2,640 ft = 80 ac, laid out in southern Minnesota.
const cornField = rectangleLayout([corn16], 1320, 2640);
const stripField = rectangleLayout([corn8, soy8], 1320, 2640);
const split = (nOnSoybean = false) =>
	planter(16, (u) => (u <= 8 ? { seed: corn(), fertilizerOn: ['n'] } : { seed: soybean(), fertilizerOn: nOnSoybean ? ['n'] : [] }));

describe('seed amounts', () => {
	it('80 ac of corn at 34,000 seeds/ac is 34.0 units of 80,000', () => {
		expect(cornField.plantedAcres).toBeCloseTo(80, 4);
		const q = seedAndFertilizerQuantities(cornField.lanes, cornField.lanes.map((l) => assign(l.index, 'hybrid A', 34_000)), split());
		expect(q.varieties).toHaveLength(1);
		const v = q.varieties[0];
		// Arithmetic: 80 ac × 34,000 ÷ 80,000 = 34.0 units (80,000 kernels a unit is common practice).
		expect(v.unitsExact).toBeCloseTo(34.0, 4);
		expect(v.unitsWhole).toBe(34);
		expect(v.bags).toBe(34);
		expect(v.seeds).toBeCloseTo(2_720_000, -1);
		expect(v).toMatchObject({ crop: 'corn', variety: 'hybrid A', seedsPerUnit: 80_000, seedsPerUnitBasis: 'common practice' });
		expect(toSheetQuantities(q)[0]).toEqual({
			label: 'Corn — hybrid A',
			amount: '34.0 units (2,720,000 seeds)',
			detail: '80.00 ac × 34,000 seeds/ac (entered) ÷ 80,000 seeds per unit (common practice); 34 whole units.'
		});
	});

	it('groups lanes by variety; soybean units hold 140,000 seeds unless the seller says otherwise', () => {
		const lanes = stripField.lanes;
		const assignments = lanes.map((l) =>
			l.crop === 'corn' ? assign(l.index, l.index % 4 === 0 ? 'hybrid A' : 'hybrid B', 34_000) : assign(l.index, 'variety S', 140_000)
		);
		const q = seedAndFertilizerQuantities(lanes, assignments, split());
		expect(q.varieties.map((v) => [v.crop, v.variety, v.laneIndexes.length])).toEqual([
			['corn', 'hybrid A', 17],
			['soybean', 'variety S', 33],
			['corn', 'hybrid B', 16]
		]);
		const acresA = acresOf(lanes, (l) => l.crop === 'corn' && l.index % 4 === 0);
		expect(q.varieties[0].unitsExact).toBeCloseTo((acresA * 34_000) / 80_000, 9); // arithmetic: acres × seeds/ac ÷ seeds per unit
		// 40 ac × 140,000 ÷ 140,000 = 40.0 units (140,000 a unit: common practice).
		expect(q.varieties[1].acres).toBeCloseTo(40, 4);
		expect(q.varieties[1].unitsExact).toBeCloseTo(40.0, 4);
		expect(q.totals.byCrop.corn.unitsExact).toBeCloseTo(17.0, 4);
		// Whole units per variety, then summed: hybrid A 8.76 → 9, hybrid B 8.24 → 9.
		expect(q.varieties[2].unitsExact).toBeCloseTo(8.2424, 4);
		expect(q.totals.byCrop.corn.unitsWhole).toBe(18);
	});

	it('takes the seller’s seeds per unit and units per bag when entered', () => {
		const lanes = stripField.lanes;
		const assignments = lanes.map((l) => assign(l.index, l.crop === 'corn' ? 'hybrid A' : 'variety S', l.crop === 'corn' ? 34_000 : 140_000));
		const q = seedAndFertilizerQuantities(lanes, assignments, split(), { seedsPerUnit: { soybean: 130_000 }, unitsPerBag: { corn: 50 } });
		const [cornQ, soyQ] = q.varieties;
		// 40 ac × 140,000 ÷ 130,000 = 43.08 units → 44 whole units (arithmetic).
		expect(soyQ.unitsExact).toBeCloseTo(43.077, 3);
		expect(soyQ.unitsWhole).toBe(44);
		expect(soyQ.seedsPerUnitBasis).toBe('entered');
		// 40 ac × 34,000 ÷ 80,000 = 17 units: one bulk box of 50 units.
		expect(cornQ.unitsExact).toBeCloseTo(17, 4);
		expect(cornQ.bags).toBe(1);
	});

	it('leaves out lanes without a seeding rate and crops without a unit size, saying so', () => {
		const sunflower: LaneSpec = { kind: 'crop', crop: 'sunflower', rows: 8, rowSpacingIn: 30 };
		const { lanes } = rectangleLayout([corn8, sunflower], 40);
		const q = seedAndFertilizerQuantities(lanes, [assign(0, 'hybrid A', null), assign(1, 'oilseed C', 22_000), assign(9, 'x', 1)], split());
		expect(q.varieties).toHaveLength(1);
		expect(q.varieties[0]).toMatchObject({ crop: 'sunflower', unitsExact: null, unitsWhole: null, bags: null });
		expect(q.varieties[0].seeds).toBeCloseTo(lanes[1].acres * 22_000, 6);
		expect(q.notes).toContain('Lane 1 (corn) has no seeding rate entered; it is left out of the seed amounts.');
		expect(q.notes).toContain('No seeds-per-unit figure for sunflower; enter the seller\'s count to get units.');
		expect(q.notes).toContain('An assignment names lane 10, which is not in this plan; it was left out.');
	});

	it('area noise far below a unit does not buy another unit; a real excess does', () => {
		const lane = (acres: number) => [{ index: 0, kind: 'crop' as const, crop: 'corn', widthFt: 40, rows: 16, offsetFt: 0, acres }];
		const units = (acres: number) => seedAndFertilizerQuantities(lane(acres), [assign(0, 'hybrid A', 34_000)], split()).varieties[0];
		expect(units(80.00000005).unitsWhole).toBe(34);
		expect(units(80.01).unitsExact).toBeCloseTo(34.00425, 5);
		expect(units(80.01).unitsWhole).toBe(35);
	});

	it('refuses an assigned lane without acres', () => {
		const lane = { index: 0, kind: 'crop' as const, crop: 'corn', widthFt: 20, rows: 8, offsetFt: 0 };
		expect(() => seedAndFertilizerQuantities([lane], [assign(0, 'hybrid A', 34_000)], split())).toThrow(EquipmentError);
	});
});

describe('fertilizer amounts', () => {
	const lanes = stripField.lanes;
	const cornAcres = acresOf(lanes, (l) => l.crop === 'corn');

	it('15 gal/ac of UAN 32 % at the entered 11.06 lb/gal on the corn lanes: 53.09 lb N/ac', () => {
		const uan32 = { name: 'UAN 32 %', percentN: 32, poundsPerGallon: 11.06 };
		const q = seedAndFertilizerQuantities(lanes, [], split(), { rates: { n: { gallonsPerAcre: 15, product: uan32 } } });
		const n = q.fertilizer[0];
		// lb N/ac = gal/ac × lb/gal × %N ÷ 100 (J. Camberato, "Calculating nitrogen rates from liquid
		// fertilizer products", Purdue University Extension, 2023): 15 × 11.06 × 0.32 = 53.09. The
		// 11.06 lb/gal is the farm's entry in this test, not a published density.
		expect(n.poundsNPerAcre).toBeCloseTo(53.09, 2);
		expect(n.densityBasis).toBe('entered');
		expect(cornAcres).toBeCloseTo(40, 4);
		expect(n.acres).toBeCloseTo(cornAcres, 9);
		expect(n.gallons).toBeCloseTo(600, 3);
		expect(n.poundsN).toBeCloseTo(53.088 * 40, 2);
		expect(n.laneIndexes).toEqual(lanes.filter((l) => l.crop === 'corn').map((l) => l.index));
		expect(q.totals.gallonsByProduct).toEqual({ 'UAN 32 %': n.gallons });
		expect(q.notes).toEqual(['No rate entered for Starter; it is left out of the fertilizer amounts.']);
		expect(toSheetQuantities(q)).toEqual([
			{
				label: 'UAN 32 % (Nitrogen)',
				amount: '600.0 gal · 2,123.5 lb N',
				detail: '15.0 gal/ac (entered) × 40.00 ac where the line is on; 11.06 lb/gal (entered) × 32 % N = 53.09 lb N/ac.'
			}
		]);
	});

	it('UAN 32 % with no density entered: gallons only, and a note asking for the label\'s lb/gal', () => {
		const q = seedAndFertilizerQuantities(lanes, [], split(), { rates: { n: { gallonsPerAcre: 15 } } });
		const n = q.fertilizer[0];
		expect(n.product).toBe('UAN 32 %');
		expect([n.percentN, n.poundsPerGallon, n.densityBasis, n.poundsNPerAcre, n.poundsN]).toEqual([null, null, null, null, null]);
		expect(n.gallons).toBeCloseTo(600, 3);
		expect(q.notes).toContain('Nitrogen: no analysis for UAN 32 %; enter its %N and lb/gal from the product label or SDS to get pounds of N.');
		expect(toSheetQuantities(q)[0]).toEqual({
			label: 'UAN 32 % (Nitrogen)',
			amount: '600.0 gal',
			detail: '15.0 gal/ac (entered) × 40.00 ac where the line is on; no analysis entered.'
		});
		expect(JSON.stringify([toSheetQuantities(q), q.notes])).not.toMatch(/from memory|11\.06/);
	});

	it('20 gal/ac of UAN 28 %, found by the line\'s product name: 59.4 lb N/ac', () => {
		const uan28 = planter(8, () => ({ seed: corn(), fertilizerOn: ['n'] }), 30, [{ ...nitrogenLine, product: 'UAN 28 %' }]);
		const q = seedAndFertilizerQuantities(lanes, [], uan28, { rates: { n: { gallonsPerAcre: 20 } } });
		// J. Camberato, Purdue Extension (2023): 20 gal/ac × 10.6 lb/gal × 28 % → 59.4 lb N/ac.
		expect(q.fertilizer[0].poundsNPerAcre).toBeCloseTo(59.4, 1);
		expect(q.fertilizer[0].densityBasis).toBe('published');
	});

	it('an entered analysis replaces the preset', () => {
		const q = seedAndFertilizerQuantities(lanes, [], split(), { rates: { n: { gallonsPerAcre: 15, product: { name: 'UAN 32 % (cold)', percentN: 32, poundsPerGallon: 11.2 } } } });
		expect(q.fertilizer[0].poundsNPerAcre).toBeCloseTo(15 * 11.2 * 0.32, 9);
		expect(q.fertilizer[0].densityBasis).toBe('entered');
		expect(q.notes).not.toContain(NITROGEN_DENSITY_CAUTION);
	});

	it('nitrogen plumbed to the soybean units too goes out on all 80 ac', () => {
		const q = seedAndFertilizerQuantities(lanes, [], split(true), { rates: { n: { gallonsPerAcre: 15, product: 'uan-28' } } });
		expect(q.fertilizer[0].acres).toBeCloseTo(80, 4);
		expect(q.fertilizer[0].gallons).toBeCloseTo(1_200, 2);
	});

	it('given passes, a line\'s acres follow where it is on: back-and-forth puts nitrogen on the soybean lane', () => {
		const small = rectangleLayout([corn8, soy8], 80).lanes;
		const plan = planPasses({ lanes: small, pattern: [corn8, soy8], planter: split(), ends: 'alternate' });
		const q = seedAndFertilizerQuantities(plan.lanes, [], split(), { rates: { n: { gallonsPerAcre: 15, product: 'uan-28' } }, passes: plan.passes });
		expect(q.fertilizer[0].laneIndexes).toEqual([0, 3]);
		expect(q.fertilizer[0].acres).toBeCloseTo(small[0].acres + small[3].acres, 12);
	});

	it('a line on at half the corn units counts half the corn acres', () => {
		const half = planter(8, (u) => ({ seed: corn(), fertilizerOn: u <= 4 ? ['starter'] : [] }), 30, [starterLine]);
		const q = seedAndFertilizerQuantities(lanes, [], half, { rates: { starter: { gallonsPerAcre: 5, product: { name: '10-34-0', percentN: 10, poundsPerGallon: 11.65 } } } });
		expect(q.fertilizer[0].acres).toBeCloseTo(cornAcres / 2, 9);
		expect(q.totals.poundsN).toBeCloseTo((cornAcres / 2) * 5 * 11.65 * 0.1, 6);
	});

	it('refuses a negative rate and an unknown preset', () => {
		expect(() => seedAndFertilizerQuantities(lanes, [], split(), { rates: { n: { gallonsPerAcre: -1 } } })).toThrow(/zero or more gallons per acre/);
		expect(() => seedAndFertilizerQuantities(lanes, [], split(), { rates: { n: { gallonsPerAcre: 10, product: 'uan-30' as 'uan-28' } } })).toThrow(/no product preset "uan-30"/);
	});

	it('never words an amount as a recommendation', () => {
		const q = seedAndFertilizerQuantities(lanes, lanes.map((l) => assign(l.index, 'A', l.crop === 'corn' ? 34_000 : 140_000)), split(), { rates: { n: { gallonsPerAcre: 15 } } });
		const text = JSON.stringify([toSheetQuantities(q), q.notes]);
		expect(text).not.toMatch(/recommend/i);
		expect(text).toContain('(entered)');
	});
});

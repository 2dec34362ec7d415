import { describe, expect, it } from 'vitest';
import { condenseFindings, condenseWarnings, laneListWords, ROTATION_WORDS } from '$lib/farm/condense';
import { checkGroupsOf, driveBackGroup, fitGroups, laneGroupLabel, laneGroups, passSetup, usualSetup, wantsAppendix } from '$lib/sheet/condensed';
import { implementChecks } from '$lib/equipment/index';
import type { SheetLane } from '$lib/sheet/types';

const nitrogen = (pass: number, lane: number) => ({
	kind: 'fertilizer_wrong_crop' as const,
	severity: 'stop' as const,
	laneIndex: lane - 1,
	message: `Pass ${pass} (from A): Nitrogen is on at row unit 9 over lane ${lane} (soybean), but that line is meant for corn. Turn it off at that unit or re-plumb the line.`
});

describe('findings said once per kind', () => {
	it('joins messages that differ only in pass and lane, with both listed compactly, STOP first', () => {
		const out = condenseFindings([
			{ kind: 'other', severity: 'warn', laneIndex: null, message: 'Pass 3 (from A): row units 1–8 plant corn outside every lane of the plan. Shut them off there.' },
			...Array.from({ length: 31 }, (_, i) => nitrogen(i + 1, 2 * i + 2))
		]);
		expect(out).toHaveLength(2);
		expect(out[0].severity).toBe('stop');
		expect(out[0].summary).toBe('31 passes (1, 2, 3 … 31): Nitrogen is on at row unit 9 over 31 soybean lanes (2, 4, 6 … 62), but that line is meant for corn. Turn it off at that unit or re-plumb the line.');
		expect(out[0].details).toHaveLength(31);
		expect(out[0].laneNumbers).toHaveLength(31);
		// One of a kind stays word for word.
		expect(out[1].summary).toBe('Pass 3 (from A): row units 1–8 plant corn outside every lane of the plan. Shut them off there.');
	});

	it('keeps lanes of different crops apart, and a message naming two lanes whole', () => {
		const out = condenseFindings([
			{ kind: 'k', laneIndex: 0, message: 'Lane 1 (corn): 8 of 8 rows are not planted by these passes.' },
			{ kind: 'k', laneIndex: 2, message: 'Lane 3 (corn): 8 of 8 rows are not planted by these passes.' },
			{ kind: 'k', laneIndex: 1, message: 'Lane 2 (soybean): 8 of 8 rows are not planted by these passes.' },
			{ kind: 'k', laneIndex: 4, message: 'Lane 5 (corn) is planted with lane 6 (soybean) together.' },
			{ kind: 'k', laneIndex: 6, message: 'Lane 7 (corn) is planted with lane 8 (soybean) together.' }
		]);
		expect(out.map((w) => w.summary)).toEqual([
			'2 corn lanes (1, 3): 8 of 8 rows are not planted by these passes.',
			'Lane 2 (soybean): 8 of 8 rows are not planted by these passes.',
			'Lane 5 (corn) is planted with lane 6 (soybean) together.',
			'Lane 7 (corn) is planted with lane 8 (soybean) together.'
		]);
		expect(laneListWords([4])).toBe('lane 4');
		expect(laneListWords([9, 3, 5], 'corn')).toBe('3 corn lanes (3, 5, 9)');
	});

	it('marks rotation warnings as warnings and words corn beside corn for the whole group', () => {
		const out = condenseWarnings(Array.from({ length: 7 }, (_, i) => ({ kind: 'corn_borders_corn', laneIndex: 2 * i, message: `Lane ${2 * i + 1} (corn) borders last season's corn.` })), ROTATION_WORDS);
		expect(out[0]).toMatchObject({ severity: 'warn', summary: "7 corn lanes (1, 3, 5 … 13) border last season's corn: scout their edge rows for rootworm." });
	});
});

describe('what a sheet problem costs', () => {
	const lanes = Array.from({ length: 6 }, (_, i) => ({ index: i, widthFt: 20, acres: (20 * 2640) / 43_560 }));
	const passes = [0, 1, 2].map((p) => ({ number: p + 1, startsAt: 'A' as const, laneIndexes: [2 * p, 2 * p + 1] }));

	it('counts empty returns and the miles driven back with the planter raised', () => {
		const drives = [2, 3].map((n) => ({ passNumber: n, message: `Pass ${n} starts from A again, like pass ${n - 1}.` }));
		const g = driveBackGroup(drives, passes, lanes);
		// Two runs back over a 2,640-ft field: one mile.
		expect(g?.summary).toBe('All 3 passes run from A: 2 empty returns, about 1 mile driven with the planter raised (from B, seed boxes would run over the wrong crop).');
		expect(g?.details).toHaveLength(2);
		expect(driveBackGroup([], passes, lanes)).toBeNull();
		const some = driveBackGroup([drives[1]], [...passes, { number: 4, startsAt: 'B' as const, laneIndexes: [5] }], lanes);
		expect(some?.summary).toMatch(/^Pass 3 starts from the same end as the pass before: 1 empty return, about 0\.5 mile driven/);
	});

	it('says ground covered twice and neighbouring lanes reached, per implement, with every lane in the details', () => {
		const reports = implementChecks(lanes.map((l) => ({ ...l, kind: 'crop' as const, crop: l.index % 2 ? 'soybean' : 'corn', rows: 8, offsetFt: l.index * 20 })), [
			{ name: '15-ft drill', kind: 'drill', workingWidthFt: 15 },
			{ name: '60-ft sprayer', kind: 'sprayer', workingWidthFt: 60 }
		]);
		const out = fitGroups(reports, lanes);
		expect(out).toHaveLength(2);
		// Each 20-ft lane (1.21 ac) takes two 15-ft passes: 10 ft of its 20 seeded twice, 0.61 ac a lane.
		expect(out[0].summary).toBe('15-ft drill: 6 lanes (1, 2, 3, 4, 5, 6), 20 ft each: 2 passes a lane, the last overlapping the one before (it covers 33 % of its width); about 3.6 ac covered twice.');
		expect(out[0].details).toHaveLength(6);
		// Centred on a 20-ft lane, 20 ft on each side: twice the lane's 1.21 ac, six times over.
		expect(out[1].summary).toBe('60-ft sprayer: 6 lanes (1, 2, 3, 4, 5, 6), 20 ft each: wider than the lane, it reaches 240 in onto each neighbour; about 15 ac of neighbouring lanes under it in all.');
	});
});

describe('lanes and passes said once', () => {
	const lane = (index: number, over: Partial<SheetLane> = {}): Omit<SheetLane, 'geometry'> => ({ index, kind: 'crop', crop: index % 2 ? 'soybean' : 'corn', widthFt: 20, rows: 8, rowSpacingIn: 30, acres: 2, variety: null, populationPerAcre: null, trialLabel: null, ...over });

	it('puts lanes set up alike in one row, in lane order, acres added', () => {
		const groups = laneGroups([lane(0), lane(1), lane(2), lane(3), lane(4, { trialLabel: 'check strip' }), lane(5), lane(6)]);
		expect(groups.map(laneGroupLabel)).toEqual(['Lanes 1, 3, 7 (3)', 'Lanes 2, 4, 6 (3)', 'Lane 5']);
		expect(groups[0].acres).toBe(6);
	});

	it('finds the setup most passes share, lane numbers left out', () => {
		expect(passSetup('Lanes 3–4: units 1–8 corn (hybrid A) on lane 3, units 9–16 soybean on lane 4')).toBe('units 1–8 corn (hybrid A), units 9–16 soybean');
		expect(passSetup('Nothing planted; units 1–16 off')).toBe('Nothing planted; units 1–16 off');
		const passes = [
			{ summary: 'Lanes 1–2: units 1–8 corn on lane 1, units 9–16 soybean on lane 2' },
			{ summary: 'Lanes 3–4: units 1–8 corn on lane 3, units 9–16 soybean on lane 4' },
			{ summary: 'Lane 5: units 1–8 corn on lane 5; units 9–16 off' }
		];
		expect(usualSetup(passes)).toBe('units 1–8 corn, units 9–16 soybean');
		expect(usualSetup(passes.slice(2))).toBeNull();
	});

	it('reads ?appendix=1 and condenses a sheet that came without its lines', () => {
		expect(wantsAppendix(new URL('http://x/s?appendix=1'))).toBe(true);
		expect(wantsAppendix(new URL('http://x/s?appendix=0'))).toBe(false);
		expect(wantsAppendix(new URL('http://x/s'))).toBe(false);
		const groups = checkGroupsOf({ checks: [1, 2].map((p) => ({ ...nitrogen(p, 2 * p), unit: 9 })) });
		expect(groups).toHaveLength(1);
		expect(groups[0].summary).toMatch(/^2 passes \(1, 2\): Nitrogen is on at row unit 9 over 2 soybean lanes \(2, 4\)/);
	});
});

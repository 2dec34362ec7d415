import { describe, expect, it } from 'vitest';
import { fitGroups, letteredPasses, passSetupKeys } from '$lib/sheet/condensed';
import { implementChecks } from '$lib/equipment/index';

// A planter that does not suit its lanes makes many passes with several setups: the sheet names
// each setup once, by letter, and puts the letter beside each pass.

const pass = (number: number, summary: string, unitsOn: number) => ({ number, summary, unitsOn });

describe('setup letters for a dense pass grid', () => {
	const passes = [
		pass(2, 'Lane 1: units 2, 4, 6 and 8 corn (hybrid A) on lane 1; units 1, 3, 5, 7 and 9–16 off', 4),
		pass(1, 'Lane 1: units 1, 3, 5 and 7 corn (hybrid A) on lane 1; units 2, 4, 6 and 8–16 off', 4),
		pass(3, 'Lanes 1–2: units 1, 3, 5 and 7 corn (hybrid A) on lane 2; units 2, 4, 6 and 8–16 off', 4),
		pass(4, 'Lane 2: unit 8 corn (hybrid A) on lane 2; units 1–7 and 9–16 off', 1)
	];

	it('letters setups in driving order, says each once with its units on, and gives each pass its letter', () => {
		const { keys, letterOf } = passSetupKeys(passes);
		expect(keys.map((k) => [k.letter, k.unitsOn, k.passes])).toEqual([
			['a', 4, [1, 3]],
			['b', 4, [2]],
			['c', 1, [4]]
		]);
		expect(keys[0].setup).toBe('units 1, 3, 5 and 7 corn (hybrid A); units 2, 4, 6 and 8–16 off');
		// The key names the units planting; the units not named are off.
		expect(keys[0].planting).toBe('units 1, 3, 5 and 7 corn (hybrid A)');
		expect([...letterOf.entries()].sort((x, y) => x[0] - y[0])).toEqual([[1, 'a'], [2, 'b'], [3, 'a'], [4, 'c']]);
	});

	it('letters a grid only when its passes use more than two setups', () => {
		expect(letteredPasses(passes)).toBe(true);
		expect(letteredPasses(passes.slice(0, 2))).toBe(false);
		expect(letteredPasses([])).toBe(false);
	});

	it('goes on past z without repeating a letter', () => {
		const many = Array.from({ length: 30 }, (_, i) => pass(i + 1, `Lane 1: unit ${i + 1} corn on lane 1`, 1));
		const { keys } = passSetupKeys(many);
		expect(new Set(keys.map((k) => k.letter)).size).toBe(30);
		expect(keys[25].letter).toBe('z');
		expect(keys[26].letter).toBe('a2');
	});
});

describe('one line per implement', () => {
	it('joins an implement\'s misfits on lanes of two widths into one line, every lane kept in the details', () => {
		const lanes = Array.from({ length: 4 }, (_, i) => ({ index: i, acres: 1, widthFt: i % 2 ? 10 : 20 }));
		const reports = implementChecks(lanes.map((l) => ({ ...l, kind: 'crop' as const, crop: 'corn', rows: 8, offsetFt: l.index * 15 })), [{ name: '15-ft drill', kind: 'drill', workingWidthFt: 15 }]);
		const out = fitGroups(reports, lanes);
		expect(out).toHaveLength(1);
		expect(out[0].summary).toBe(
			'15-ft drill: 2 lanes (1, 3), 20 ft each: 2 passes a lane, the last overlapping the one before (it covers 33 % of its width); about 1.0 ac covered twice; 2 lanes (2, 4), 10 ft each: wider than the lane, it reaches 30 in onto each neighbour; about 1.0 ac of neighbouring lanes under it in all.'
		);
		expect(out[0].details).toHaveLength(4);
		expect(out[0].laneNumbers).toEqual([1, 2, 3, 4]);
	});
});

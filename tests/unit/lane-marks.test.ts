import { describe, expect, it } from 'vitest';
import { LANE_KIND_MARKS, markPath } from '../../src/lib/components/map/lane-marks';

describe('lane kind marks', () => {
	it('give crop lanes a plain fill and every other kind a mark of its own', () => {
		expect(LANE_KIND_MARKS.map((m) => m.kind)).toEqual(['crop', 'pasture', 'cover', 'buffer']);
		expect(markPath('crop')).toBe('');
		const marks = ['pasture', 'cover', 'buffer'].map((k) => markPath(k));
		for (const m of marks) expect(m).toMatch(/^M/);
		expect(new Set(marks).size).toBe(3);
	});

	it('tiles seamlessly: the diagonal reaches both corners of its tile', () => {
		expect(markPath('pasture', 10)).toBe('M0 10L10 0M-5 5L5 -5M5 15L15 5');
		expect(markPath('buffer', 10)).toBe('M0 10L10 0M0 0L10 10');
	});
});

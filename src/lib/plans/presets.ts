// Starting points for a lane pattern. Widths follow the equipment: rows × row spacing.
import type { LaneSpec } from '../geometry/index';

export interface PatternPreset {
	id: string;
	label: string;
	pattern: LaneSpec[];
}

export const PATTERN_PRESETS: PatternPreset[] = [
	{
		id: 'corn-soy-8',
		label: '8-row corn / 8-row soybean, 30-in rows',
		pattern: [
			{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 },
			{ kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 }
		]
	},
	{
		id: 'corn-soy-12',
		label: '12-row corn / 12-row soybean, 30-in rows',
		pattern: [
			{ kind: 'crop', crop: 'corn', rows: 12, rowSpacingIn: 30 },
			{ kind: 'crop', crop: 'soybean', rows: 12, rowSpacingIn: 30 }
		]
	},
	{
		id: 'corn-pasture',
		label: 'Corn and soybean strips beside 10-ft pasture lanes',
		pattern: [
			{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 },
			{ kind: 'pasture', crop: 'pasture', widthFt: 10 },
			{ kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 },
			{ kind: 'pasture', crop: 'pasture', widthFt: 10 }
		]
	},
	{
		id: 'wide-60',
		label: 'Twin-row corn on 60-in centres, cover between',
		pattern: [{ kind: 'crop', crop: 'corn', rows: 12, rowSpacingIn: 60, twinSpacingIn: 8 }]
	},
	{
		id: 'wide-72',
		label: 'Twin-row corn on 72-in centres, cover between',
		pattern: [{ kind: 'crop', crop: 'corn', rows: 10, rowSpacingIn: 72, twinSpacingIn: 8 }]
	},
	{
		id: 'wide-90',
		label: 'Twin-row corn on 90-in centres, cover between',
		pattern: [{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 90, twinSpacingIn: 8 }]
	},
	{
		id: 'wide-check',
		label: 'Twin-row corn on 72-in centres with a 30-in check strip',
		pattern: [
			{ kind: 'crop', crop: 'corn', rows: 10, rowSpacingIn: 72, twinSpacingIn: 8 },
			{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 }
		]
	}
];

/** A-B line along the west side of the field's bounding box, south to north: a start to adjust. */
export function defaultGuidance(bbox: [number, number, number, number]): { a: [number, number]; b: [number, number] } {
	const [west, south, , north] = bbox;
	return { a: [west, south], b: [west, north] };
}

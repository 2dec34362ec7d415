import { describe, expect, it } from 'vitest';
import config from '../../tailwind.config.js';

// Relative luminance and contrast ratio as defined in the Web Content Accessibility Guidelines
// (WCAG) 2.1, W3C Recommendation, 2018 ("relative luminance", "contrast ratio"); AA asks 4.5:1 for
// body text and 3:1 for focus indicators and other non-text marks.
function luminance(hex: string): number {
	const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255).map((c) => (c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4));
	return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}
function contrast(a: string, b: string): number {
	const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
	return (hi + 0.05) / (lo + 0.05);
}

const colors = config.theme!.extend!.colors as Record<string, Record<number, string>>;
const { ink, clay, loam } = colors;
const white = '#ffffff';

describe('palette contrast (WCAG 2.1 AA)', () => {
	it('checks the formula on black and white: 21:1', () => {
		expect(contrast('#000000', white)).toBeCloseTo(21, 5);
	});

	it.each([
		['header and nav text on the white header', ink[700], white],
		['links on the page background', ink[700], loam[50]],
		['white text on primary buttons', white, ink[700]],
		['the signed-in name in the header', ink[500], white],
		['body text on the page background', loam[900], loam[50]],
		['hints on white cards', loam[700], white],
		['role badges', ink[900], ink[100]],
		['the default-planter badge', loam[900], clay[400]]
	])('%s reach 4.5:1', (_what, fg, bg) => {
		expect(contrast(fg, bg)).toBeGreaterThanOrEqual(4.5);
	});

	it('the clay focus ring stands out 3:1 from white and the page background', () => {
		expect(contrast(clay[500], white)).toBeGreaterThanOrEqual(3);
		expect(contrast(clay[500], loam[50])).toBeGreaterThanOrEqual(3);
	});

	it('keeps no green or yellow chrome scale', () => {
		expect(Object.keys(colors).sort()).toEqual(['clay', 'ink', 'loam']);
	});
});

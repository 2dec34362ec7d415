import { describe, expect, it } from 'vitest';
import { cropColor } from '$lib/plans/crop-colors';

// Relative luminance and contrast ratio as defined in the Web Content Accessibility Guidelines
// (WCAG) 2.1, W3C Recommendation, 2018. Lightness is what survives colour blindness and grey print.
function luminance(hex: string): number {
	const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255).map((c) => (c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4));
	return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}
const lightnessRatio = (a: string, b: string) => {
	const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
	return (hi + 0.05) / (lo + 0.05);
};

describe('crop colours', () => {
	// Strip neighbours in common practice: a row crop beside the other row crop or a small grain.
	it.each([
		['corn', 'soybean'],
		['corn', 'wheat'],
		['corn', 'oats'],
		['soybean', 'wheat'],
		['soybean', 'oats']
	])('%s and %s differ in lightness by at least 1.5:1', (a, b) => {
		expect(lightnessRatio(cropColor(a), cropColor(b))).toBeGreaterThanOrEqual(1.5);
	});

	it('reads names without regard to case or spaces and gives unknown crops a stable colour', () => {
		expect(cropColor(' Corn ')).toBe(cropColor('corn'));
		expect(cropColor('sorghum')).toBe(cropColor('sorghum'));
		expect(cropColor('sorghum')).toMatch(/^#[0-9a-f]{6}$/);
	});
});

// Numbers as the harvest pages show them: always with their unit.
import type { MeanDifference } from '$lib/harvest/stats';

export const buAc = (v: number | null | undefined, digits = 1) => (v == null || !Number.isFinite(v) ? '—' : `${v.toFixed(digits)} bu/ac`);
export const acres = (v: number | null | undefined) => (v == null ? '—' : `${v.toFixed(2)} ac`);
export const pounds = (v: number) => `${Math.round(v).toLocaleString('en-US')} lb`;
export const bushels = (v: number) => `${v.toLocaleString('en-US', { maximumFractionDigits: 1, minimumFractionDigits: 1 })} bu`;
export const percent = (v: number | null | undefined, digits = 1) => (v == null || !Number.isFinite(v) ? '—' : `${v.toFixed(digits)} %`);
export const signed = (v: number, digits = 1) => `${v >= 0 ? '+' : '−'}${Math.abs(v).toFixed(digits)}`;

/** "+12.3 bu/ac (95 % CI +4.1 to +20.5)" or without an interval when none can be estimated. */
export function difference(d: MeanDifference): string {
	const main = `${signed(d.difference)} bu/ac`;
	return d.ci95 ? `${main} (95 % CI ${signed(d.ci95[0])} to ${signed(d.ci95[1])} bu/ac)` : `${main} (no interval)`;
}

export const POSITION_LABELS = { all: 'Whole lane', outside: 'Outside rows', inside: 'Inside rows' } as const;


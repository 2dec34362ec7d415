import { notFound } from './errors';

/** A crop year from the URL; anything else is simply not a plan we have. */
export function parseSeason(value: string): number {
	const n = Number(value);
	if (!/^\d{4}$/.test(value) || n < 1900 || n > 2200) throw notFound(`season "${value}"`);
	return n;
}

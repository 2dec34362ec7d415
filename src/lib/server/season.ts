import { notFound } from './errors';

/** Whether the text is a crop year this site plans for (four digits, 1900–2200). */
export function isSeasonText(value: string): boolean {
	return /^\d{4}$/.test(value) && Number(value) >= 1900 && Number(value) <= 2200;
}

/** A crop year from the URL; anything else is simply not a plan we have. */
export function parseSeason(value: string): number {
	if (!isSeasonText(value)) throw notFound(`season "${value}"`);
	return Number(value);
}

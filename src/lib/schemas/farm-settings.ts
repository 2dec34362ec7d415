import { z } from 'zod';
import { isKnownTimeZone } from '../time-zones';

export const farmUnitsSchema = z.object({
	units: z.enum(['us', 'metric'], { error: 'Choose US customary or metric.' })
});

export const farmTimeZoneSchema = z.object({
	timeZone: z
		.string()
		.trim()
		.min(1, { error: 'Choose the time zone the farm works in.', abort: true })
		.max(64, { error: 'That is not a time zone name: use at most 64 characters.', abort: true })
		.refine(isKnownTimeZone, { error: (issue) => `"${String(issue.input).slice(0, 64)}" is not a time zone this server knows. Choose one from the list, e.g. America/Chicago.` })
});

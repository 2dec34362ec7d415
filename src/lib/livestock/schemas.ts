// The shapes the livestock API and forms accept; shared by the routes and the pages.
import { z } from 'zod';
import { SPECIES } from './species';

const text = (max: number) => z.string().trim().max(max).nullish().transform((v) => v || null);

export const groupCreateSchema = z.object({
	name: z.string({ message: 'Name the group.' }).trim().min(1, 'Name the group.').max(80, 'At most 80 characters.'),
	species: z.enum(SPECIES as [string, ...string[]], { message: `Choose the species: ${SPECIES.join(', ')}.` }),
	head: z.number({ message: 'Give the head count as a whole number.' }).int('Give the head count as a whole number.').min(0, 'A head count cannot be negative.').max(1_000_000, 'Over a million head looks like a typo.'),
	averageWeightLb: z.number({ message: 'Give the average weight in lb.' }).gt(0, 'The average weight must be more than 0 lb.').max(5_000, 'Over 5,000 lb a head looks like a typo.'),
	notes: text(2000)
});
export type GroupCreateInput = z.infer<typeof groupCreateSchema>;

export const groupPatchSchema = z.object({
	name: z.string().trim().min(1, 'Name the group.').max(80).optional(),
	averageWeightLb: z.number().gt(0, 'The average weight must be more than 0 lb.').max(5_000, 'Over 5,000 lb a head looks like a typo.').optional(),
	notes: text(2000).optional(),
	version: z.number({ message: 'Send the version of the group you edited (a whole number).' }).int()
});
export type GroupPatchInput = z.infer<typeof groupPatchSchema>;

export const EVENT_KINDS = ['birth', 'purchase', 'sale', 'death', 'loss'] as const;
export type EventKind = (typeof EVENT_KINDS)[number];
export const EVENT_LABELS: Record<EventKind, string> = { birth: 'Births', purchase: 'Bought', sale: 'Sold', death: 'Deaths', loss: 'Lost' };
/** Events that take animals out of the group. */
export const EVENTS_OUT: readonly EventKind[] = ['sale', 'death', 'loss'];
export const LOSS_CAUSES = ['predator', 'weather', 'disease', 'injury', 'strayed', 'unknown', 'other'] as const;

export const eventSchema = z.object({
	kind: z.enum(EVENT_KINDS, { message: `Choose what happened: ${EVENT_KINDS.join(', ')}.` }),
	head: z.number({ message: 'Give the number of animals as a whole number.' }).int('Give the number of animals as a whole number.').min(1, 'At least 1 animal.').max(1_000_000),
	cause: text(80),
	occurredAt: z.string({ message: 'Give the date or time it happened (ISO 8601).' }).trim().min(1, 'Give the date or time it happened.'),
	notes: text(2000)
});
export type EventInput = z.infer<typeof eventSchema>;

const feet = z.number().min(0, 'Distances along the lane start at 0 ft.').max(100_000);

export const moveSchema = z.object({
	groupId: z.string({ message: 'Choose the group.' }).uuid('Choose the group.'),
	fieldId: z.string({ message: 'Choose the field.' }).uuid('Choose the field.'),
	season: z.number({ message: 'Give the season (year).' }).int().min(1900).max(2200),
	laneIndex: z.number({ message: 'Give the lane (laneIndex, 0-based).' }).int('laneIndex is a whole number.').min(0, 'laneIndex starts at 0.'),
	from: z.string({ message: 'Give when the move starts (a date or an ISO 8601 time).' }).trim().min(1),
	to: z.string({ message: 'Give when the move ends (a date or an ISO 8601 time).' }).trim().min(1),
	fromFt: feet.optional(),
	toFt: feet.optional(),
	shelterId: z.string().uuid('Choose a shelter from the equipment list.').nullish(),
	forageLbPerAcre: z.number().min(0, 'Forage cannot be negative.').max(20_000, 'Over 20,000 lb DM/ac looks like a typo.').nullish(),
	utilization: z.number().gt(0, 'Utilization is a fraction above 0 (0.5 for 50 %).').max(1, 'Utilization is a fraction up to 1 (0.5 for 50 %).').nullish(),
	intakePct: z.number().gt(0, 'Intake must be more than 0 % of body weight.').max(10, 'Over 10 % of body weight a day looks like a typo.').nullish(),
	acknowledge: z.boolean().optional(),
	notes: text(2000)
});
export type MoveInput = z.infer<typeof moveSchema>;

export const nextMoveSchema = z.object({ acknowledge: z.boolean().optional() });

import type { Knex } from 'knex';

/** Appends who did what to the audit log, inside the caller's transaction. */
export async function recordAudit(
	trx: Knex | Knex.Transaction,
	entry: { farmId: string | null; userId: string | null; entity: string; entityId?: string | null; action: string; before?: unknown; after?: unknown }
) {
	await trx('audit_log').insert({
		farm_id: entry.farmId,
		user_id: entry.userId,
		entity: entry.entity,
		entity_id: entry.entityId ?? null,
		action: entry.action,
		before: entry.before === undefined ? null : JSON.stringify(entry.before),
		after: entry.after === undefined ? null : JSON.stringify(entry.after)
	});
}

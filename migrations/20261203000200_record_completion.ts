import type { Knex } from 'knex';

// When a restricted-use pesticide record first held every element the federal rule asks for.
// Kept as saved, so whether the record was made within 14 days never depends on later edits.
export async function up(knex: Knex) {
	await knex.schema.alterTable('operations', (t) => {
		t.timestamp('rup_completed_at', { useTz: true });
	});
}

export async function down(knex: Knex) {
	await knex.schema.alterTable('operations', (t) => {
		t.dropColumn('rup_completed_at');
	});
}

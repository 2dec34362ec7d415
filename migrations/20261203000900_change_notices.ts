import type { Knex } from 'knex';

// Each app process keeps sessions, memberships and plan stamps for a few seconds. A change committed by any
// process (another app server, a script, psql) is announced on one channel with the table's name,
// so every process empties what it kept from that table at once instead of when it lapses.
// A new session cannot change one already kept, so sign-ins announce nothing.
const WATCHED: [table: string, events: string][] = [
	['sessions', 'update or delete'],
	['users', 'insert or update or delete'],
	['plans', 'insert or update or delete'],
	['plan_lanes', 'insert or update or delete'],
	['fields', 'insert or update or delete'],
	['farms', 'insert or update or delete'],
	['memberships', 'insert or update or delete']
];

export async function up(knex: Knex) {
	await knex.raw(`
		create function stripwright_announce_change() returns trigger language plpgsql as $$
		begin
			perform pg_notify('stripwright_changes', tg_table_name);
			return null;
		end $$`);
	for (const [table, events] of WATCHED) {
		// Once per statement, not per row; delivered when the transaction commits.
		await knex.raw(`create trigger ${table}_announce_change after ${events} on ${table} for each statement execute function stripwright_announce_change()`);
		await knex.raw(`create trigger ${table}_announce_truncate after truncate on ${table} for each statement execute function stripwright_announce_change()`);
	}
}

export async function down(knex: Knex) {
	for (const [table] of WATCHED) {
		await knex.raw(`drop trigger if exists ${table}_announce_change on ${table}`);
		await knex.raw(`drop trigger if exists ${table}_announce_truncate on ${table}`);
	}
	await knex.raw('drop function if exists stripwright_announce_change()');
}

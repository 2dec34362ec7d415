import type { Knex } from 'knex';

export async function up(knex: Knex) {
	// Requests counted per bucket and key in a fixed window (e.g. layout previews per user), kept in
	// PostgreSQL so every app instance counts the same requests.
	await knex.schema.createTable('request_counts', (t) => {
		t.text('bucket').notNullable();
		t.text('key').notNullable();
		t.timestamp('window_start', { useTz: true }).notNullable();
		t.integer('count').notNullable();
		t.primary(['bucket', 'key']);
	});
}

export async function down(knex: Knex) {
	await knex.schema.dropTableIfExists('request_counts');
}

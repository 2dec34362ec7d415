import type { Knex } from 'knex';

// Mail the relay did not take at once waits here and is sent again with growing pauses, so an
// action never fails (or is lost) because the SMTP relay is down for a while.
export async function up(knex: Knex) {
	await knex.schema.createTable('mail_outbox', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.text('to').notNullable();
		t.text('subject').notNullable();
		t.text('text').notNullable();
		t.jsonb('attachments').notNullable().defaultTo('[]'); // [{ filename, contentType, base64 }]
		t.integer('attempts').notNullable().defaultTo(1);
		t.text('last_error');
		t.timestamp('next_attempt_at', { useTz: true }).notNullable();
		t.timestamp('sent_at', { useTz: true });
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['sent_at', 'next_attempt_at']);
	});
}

export async function down(knex: Knex) {
	await knex.schema.dropTableIfExists('mail_outbox');
}

import type { Knex } from 'knex';

export async function up(knex: Knex) {
	// One row per e-mail and per client address: failures are counted and the resulting wait is set in
	// a single upsert, so parallel attempts cannot slip past a count read a moment earlier.
	await knex.schema.createTable('sign_in_throttles', (t) => {
		t.text('scope').notNullable().checkIn(['account', 'address']);
		t.text('key').notNullable();
		t.integer('failures').notNullable();
		t.timestamp('first_failure_at', { useTz: true }).notNullable();
		t.timestamp('last_failure_at', { useTz: true }).notNullable();
		t.timestamp('blocked_until', { useTz: true });
		t.primary(['scope', 'key']);
	});
	await knex.schema.dropTableIfExists('login_attempts');

	// A sign-up waits here until its address is confirmed by the link mailed to it; only then does a
	// user row exist, so an unconfirmed address cannot squat an account.
	await knex.schema.createTable('sign_up_requests', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.text('email').notNullable();
		t.text('name').notNullable();
		t.text('password_hash').notNullable();
		t.text('token_hash').notNullable().unique();
		t.text('redirect_to');
		t.timestamp('expires_at', { useTz: true }).notNullable();
		t.timestamp('used_at', { useTz: true });
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index('email');
	});

	// What viewers (landlords, visitors) may see beyond the fields granted to them; off unless the owner turns it on.
	await knex.schema.alterTable('farms', (t) => {
		t.boolean('viewers_see_member_emails').notNullable().defaultTo(false);
		t.boolean('viewers_see_equipment').notNullable().defaultTo(false);
	});
}

export async function down(knex: Knex) {
	await knex.schema.alterTable('farms', (t) => {
		t.dropColumn('viewers_see_member_emails');
		t.dropColumn('viewers_see_equipment');
	});
	await knex.schema.dropTableIfExists('sign_up_requests');
	await knex.schema.dropTableIfExists('sign_in_throttles');
	await knex.schema.createTable('login_attempts', (t) => {
		t.bigIncrements('id');
		t.text('email').notNullable();
		t.text('ip').notNullable();
		t.boolean('succeeded').notNullable();
		t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['email', 'at']);
		t.index(['ip', 'at']);
	});
}

import type { Knex } from 'knex';

export async function up(knex: Knex) {
	await knex.raw('CREATE EXTENSION IF NOT EXISTS pgcrypto');

	await knex.schema.createTable('users', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.text('email').notNullable();
		t.text('name').notNullable();
		t.text('password_hash').notNullable();
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
	});
	await knex.raw('CREATE UNIQUE INDEX users_email_key ON users (lower(email))');

	// Only a SHA-256 of each session id is stored: a leaked table cannot be replayed as cookies.
	await knex.schema.createTable('sessions', (t) => {
		t.text('id').primary();
		t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
		t.timestamp('expires_at', { useTz: true }).notNullable();
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index('user_id');
	});

	await knex.schema.createTable('password_resets', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.text('token_hash').notNullable().unique();
		t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
		t.timestamp('expires_at', { useTz: true }).notNullable();
		t.timestamp('used_at', { useTz: true });
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
	});

	await knex.schema.createTable('login_attempts', (t) => {
		t.bigIncrements('id');
		t.text('email').notNullable();
		t.text('ip').notNullable();
		t.boolean('succeeded').notNullable();
		t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['email', 'at']);
		t.index(['ip', 'at']);
	});

	await knex.schema.createTable('farms', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.text('name').notNullable();
		t.text('units').notNullable().defaultTo('us').checkIn(['us', 'metric']);
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('deleted_at', { useTz: true });
	});

	await knex.schema.createTable('memberships', (t) => {
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
		t.text('role').notNullable().checkIn(['owner', 'manager', 'crew', 'advisor', 'viewer']);
		// Viewers see only the fields granted here; null means every field (other roles).
		t.specificType('field_scope', 'uuid[]');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.primary(['farm_id', 'user_id']);
		t.index('user_id');
	});

	await knex.schema.createTable('invitations', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.text('email').notNullable();
		t.text('role').notNullable().checkIn(['owner', 'manager', 'crew', 'advisor', 'viewer']);
		t.text('token_hash').notNullable().unique();
		t.uuid('invited_by').references('users.id').onDelete('SET NULL');
		t.timestamp('expires_at', { useTz: true }).notNullable();
		t.timestamp('accepted_at', { useTz: true });
		t.uuid('accepted_by').references('users.id').onDelete('SET NULL');
		t.timestamp('revoked_at', { useTz: true });
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index('farm_id');
	});

	await knex.schema.createTable('audit_log', (t) => {
		t.bigIncrements('id');
		t.uuid('farm_id').references('farms.id').onDelete('CASCADE');
		t.uuid('user_id').references('users.id').onDelete('SET NULL');
		t.text('entity').notNullable();
		t.text('entity_id');
		t.text('action').notNullable();
		t.jsonb('before');
		t.jsonb('after');
		t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['farm_id', 'at']);
	});
}

export async function down(knex: Knex) {
	for (const t of ['audit_log', 'invitations', 'memberships', 'farms', 'login_attempts', 'password_resets', 'sessions', 'users']) {
		await knex.schema.dropTableIfExists(t);
	}
}

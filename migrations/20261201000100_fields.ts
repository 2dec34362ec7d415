import type { Knex } from 'knex';

export async function up(knex: Knex) {
	await knex.schema.createTable('fields', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.text('name').notNullable();
		// GeoJSON geometry (RFC 7946, WGS84); exclusions: [{ name, kind, geometry }].
		t.jsonb('boundary').notNullable();
		t.jsonb('exclusions').notNullable().defaultTo('[]');
		t.integer('boundary_version').notNullable().defaultTo(1);
		t.decimal('acres', 12, 4).notNullable();
		t.decimal('excluded_acres', 12, 4).notNullable().defaultTo(0);
		// Identifiers used on government acreage reports (farm, tract and field numbers).
		t.text('farm_number');
		t.text('tract_number');
		t.text('field_number');
		t.text('landlord');
		t.text('notes');
		t.integer('version').notNullable().defaultTo(1);
		t.uuid('created_by').references('users.id').onDelete('SET NULL');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('deleted_at', { useTz: true });
		t.index(['farm_id']);
	});
	await knex.raw('CREATE UNIQUE INDEX fields_farm_name_key ON fields (farm_id, lower(name)) WHERE deleted_at IS NULL');

	// Every boundary a field has had; plans point at the version they were laid out on.
	await knex.schema.createTable('field_boundary_versions', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		// Fields are only soft-deleted, so this cascade runs only when a whole farm is purged.
		t.uuid('field_id').notNullable().references('fields.id').onDelete('CASCADE');
		t.integer('version').notNullable();
		t.jsonb('boundary').notNullable();
		t.jsonb('exclusions').notNullable().defaultTo('[]');
		t.decimal('acres', 12, 4).notNullable();
		t.decimal('excluded_acres', 12, 4).notNullable().defaultTo(0);
		t.text('reason');
		t.uuid('created_by').references('users.id').onDelete('SET NULL');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.unique(['field_id', 'version']);
	});
}

export async function down(knex: Knex) {
	await knex.schema.dropTableIfExists('field_boundary_versions');
	await knex.schema.dropTableIfExists('fields');
}

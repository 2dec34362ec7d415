import type { Knex } from 'knex';

// Visitor tours for field days: a dated walk over some of the farm's fields with numbered stops,
// opened through a share link. Only a hash of the link's token is stored, so a copy of the
// database does not hand out working links.
export async function up(knex: Knex) {
	await knex.schema.createTable('tours', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.text('title').notNullable();
		t.date('tour_date').notNullable();
		t.timestamp('expires_at', { useTz: true }).notNullable();
		t.text('token_hash').notNullable().unique(); // SHA-256 of the link token, hex
		t.timestamp('revoked_at', { useTz: true });
		t.uuid('revoked_by').references('users.id').onDelete('SET NULL');
		// The fields the visitor sees; checked against the farm when the tour is made.
		t.specificType('field_ids', 'uuid[]').notNullable();
		t.uuid('created_by').references('users.id').onDelete('SET NULL');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['farm_id']);
	});
	await knex.raw(`ALTER TABLE tours ADD CONSTRAINT tours_title_length CHECK (char_length(title) BETWEEN 1 AND 120)`);
	await knex.raw(`ALTER TABLE tours ADD CONSTRAINT tours_has_fields CHECK (cardinality(field_ids) >= 1)`);

	await knex.schema.createTable('tour_stops', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.uuid('tour_id').notNullable().references('tours.id').onDelete('CASCADE');
		t.integer('position').notNullable(); // 0-based walking order; shown 1-based
		t.decimal('lng', 12, 9).notNullable();
		t.decimal('lat', 12, 9).notNullable();
		t.text('title').notNullable();
		t.text('note').notNullable().defaultTo('');
		t.unique(['tour_id', 'position']);
		t.index(['farm_id']);
	});
	await knex.raw(`ALTER TABLE tour_stops ADD CONSTRAINT tour_stops_on_earth CHECK (lng BETWEEN -180 AND 180 AND lat BETWEEN -90 AND 90)`);
}

export async function down(knex: Knex) {
	await knex.schema.dropTableIfExists('tour_stops');
	await knex.schema.dropTableIfExists('tours');
}

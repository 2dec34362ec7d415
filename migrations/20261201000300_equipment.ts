import type { Knex } from 'knex';

export async function up(knex: Knex) {
	await knex.schema.createTable('equipment', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.text('name').notNullable();
		t.text('kind').notNullable().checkIn(['planter', 'drill', 'sprayer', 'sidedress', 'combine_head', 'shelter']);
		t.decimal('working_width_ft', 10, 4).notNullable();
		// Planters and side-dress bars: { rowSpacingIn, rowUnits: RowUnit[], fertilizerLines: FertilizerLine[] }.
		t.jsonb('planter');
		t.integer('sections');
		t.integer('rows');
		t.decimal('length_ft', 10, 4);
		t.text('notes');
		t.boolean('is_default_planter').notNullable().defaultTo(false);
		t.integer('version').notNullable().defaultTo(1);
		t.uuid('created_by').references('users.id').onDelete('SET NULL');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('deleted_at', { useTz: true });
		t.index(['farm_id']);
	});
	await knex.raw('CREATE UNIQUE INDEX equipment_farm_name_key ON equipment (farm_id, lower(name)) WHERE deleted_at IS NULL');
	await knex.raw('CREATE UNIQUE INDEX equipment_default_planter_key ON equipment (farm_id) WHERE is_default_planter AND deleted_at IS NULL');
	// Printed sheets and record times are shown in the farm's own clock.
	await knex.schema.alterTable('farms', (t) => {
		t.text('time_zone').notNullable().defaultTo('America/Chicago');
	});
}

export async function down(knex: Knex) {
	await knex.schema.alterTable('farms', (t) => t.dropColumn('time_zone'));
	await knex.schema.dropTableIfExists('equipment');
}

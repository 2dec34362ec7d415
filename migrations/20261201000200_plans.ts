import type { Knex } from 'knex';

export async function up(knex: Knex) {
	await knex.schema.createTable('plans', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.uuid('field_id').notNullable().references('fields.id').onDelete('CASCADE');
		t.integer('season').notNullable(); // crop year
		t.text('variant').notNullable().defaultTo('main');
		t.boolean('adopted').notNullable().defaultTo(false);
		t.jsonb('guidance').notNullable(); // { a: [lng, lat], b: [lng, lat] }
		t.jsonb('pattern').notNullable(); // LaneSpec[]
		t.decimal('offset_ft', 12, 4).notNullable().defaultTo(0);
		t.decimal('headland_ft', 10, 4).notNullable().defaultTo(0);
		t.integer('boundary_version').notNullable();
		t.jsonb('assignments').notNullable().defaultTo('[]'); // LaneAssignment[]
		t.decimal('field_acres', 12, 4).notNullable();
		t.decimal('planted_acres', 12, 4).notNullable();
		t.text('notes');
		t.integer('version').notNullable().defaultTo(1);
		t.uuid('created_by').references('users.id').onDelete('SET NULL');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('deleted_at', { useTz: true });
		t.index(['farm_id', 'field_id', 'season']);
	});
	await knex.raw('CREATE UNIQUE INDEX plans_variant_key ON plans (field_id, season, lower(variant)) WHERE deleted_at IS NULL');
	// One adopted plan per field and season.
	await knex.raw('CREATE UNIQUE INDEX plans_adopted_key ON plans (field_id, season) WHERE adopted AND deleted_at IS NULL');
	await knex.raw('ALTER TABLE plans ADD CONSTRAINT plans_season_range CHECK (season BETWEEN 1900 AND 2200)');

	// The computed lanes of each saved plan, with their assignment, so records can point at a lane.
	await knex.schema.createTable('plan_lanes', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.uuid('plan_id').notNullable().references('plans.id').onDelete('CASCADE');
		t.integer('lane_index').notNullable();
		t.integer('pattern_index').notNullable();
		t.text('kind').notNullable().checkIn(['crop', 'pasture', 'cover', 'buffer']);
		t.text('crop').notNullable();
		t.decimal('width_ft', 10, 4).notNullable();
		t.integer('rows').notNullable();
		t.decimal('offset_ft', 12, 4).notNullable();
		t.jsonb('geometry').notNullable();
		t.decimal('acres', 12, 6).notNullable();
		t.decimal('row_feet', 14, 2).notNullable();
		t.integer('border_rows').notNullable();
		t.text('variety');
		t.decimal('relative_maturity', 6, 1);
		t.integer('population_per_acre');
		t.text('seed_lot');
		t.text('trial_label');
		t.text('notes');
		t.unique(['plan_id', 'lane_index']);
		t.index(['farm_id']);
	});
}

export async function down(knex: Knex) {
	await knex.schema.dropTableIfExists('plan_lanes');
	await knex.schema.dropTableIfExists('plans');
}

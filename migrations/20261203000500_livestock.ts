import type { Knex } from 'knex';

// Livestock on pasture lanes: groups with their head count, the events that change it, and the
// moves of a group (and its mobile shelter) onto a stretch of a lane for a span of time. A move
// keeps a copy of the lane as it stood when the move was logged, because plan lanes are rewritten
// on every plan save, and what was recorded must never move.
export async function up(knex: Knex) {
	const common = (t: Knex.CreateTableBuilder) => {
		t.integer('version').notNullable().defaultTo(1);
		t.uuid('created_by').references('users.id').onDelete('SET NULL');
		t.uuid('updated_by').references('users.id').onDelete('SET NULL');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('deleted_at', { useTz: true });
		t.uuid('deleted_by').references('users.id').onDelete('SET NULL');
	};

	await knex.schema.createTable('livestock_groups', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.text('name').notNullable();
		t.text('species').notNullable().checkIn(['sheep', 'goat', 'hog', 'poultry', 'cattle']);
		// The current count, kept in step with the events in the same transaction.
		t.integer('head').notNullable();
		t.decimal('average_weight_lb', null).notNullable();
		t.text('notes');
		common(t);
		t.index(['farm_id']);
	});
	await knex.raw('CREATE UNIQUE INDEX livestock_groups_name_key ON livestock_groups (farm_id, lower(name)) WHERE deleted_at IS NULL');
	await knex.raw('ALTER TABLE livestock_groups ADD CONSTRAINT livestock_groups_head_nonnegative CHECK (head >= 0)');
	await knex.raw('ALTER TABLE livestock_groups ADD CONSTRAINT livestock_groups_weight_positive CHECK (average_weight_lb > 0)');

	await knex.schema.createTable('livestock_events', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.uuid('group_id').notNullable().references('livestock_groups.id').onDelete('CASCADE');
		t.text('kind').notNullable().checkIn(['birth', 'purchase', 'sale', 'death', 'loss']);
		t.integer('head').notNullable();
		t.text('cause'); // predator, weather, disease … for deaths and losses
		t.timestamp('occurred_at', { useTz: true }).notNullable();
		// The count after this event, as it stood when the event was logged.
		t.integer('head_after').notNullable();
		t.text('notes');
		common(t);
		t.index(['farm_id', 'group_id']);
	});
	await knex.raw('ALTER TABLE livestock_events ADD CONSTRAINT livestock_events_head_positive CHECK (head > 0 AND head_after >= 0)');

	await knex.schema.createTable('grazing_moves', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.uuid('group_id').notNullable().references('livestock_groups.id').onDelete('CASCADE');
		// A mobile shelter from the equipment list; its name is copied as it was called then.
		t.uuid('shelter_id').references('equipment.id').onDelete('SET NULL');
		t.text('shelter_name');
		t.uuid('field_id').notNullable().references('fields.id').onDelete('CASCADE');
		t.integer('season').notNullable();
		t.uuid('plan_id').references('plans.id').onDelete('SET NULL');
		t.integer('plan_version');
		// The lane as it stood when the move was logged.
		t.integer('lane_index').notNullable();
		t.text('lane_kind').notNullable();
		t.text('lane_crop').notNullable();
		t.decimal('lane_acres', null).notNullable();
		t.decimal('lane_length_ft', null).notNullable();
		t.jsonb('lane_geometry').notNullable();
		// The stretch grazed: distance along the lane from its start, and its outline and area.
		t.decimal('from_ft', null).notNullable();
		t.decimal('to_ft', null).notNullable();
		t.jsonb('stretch_geometry');
		t.decimal('stretch_acres', null).notNullable();
		t.timestamp('starts_at', { useTz: true }).notNullable();
		t.timestamp('ends_at', { useTz: true }).notNullable();
		// The group as it was when the move was logged, and the figures the grazing days came from.
		t.integer('head').notNullable();
		t.decimal('average_weight_lb', null).notNullable();
		t.decimal('forage_lb_per_acre', null);
		t.decimal('utilization', null);
		t.decimal('intake_pct', null);
		// What the user acknowledged when moving onto a lane still under a restriction.
		t.jsonb('acknowledged_restriction');
		t.text('notes');
		common(t);
		t.index(['farm_id', 'field_id', 'season']);
		t.index(['group_id']);
		t.index(['shelter_id']);
	});
	await knex.raw('ALTER TABLE grazing_moves ADD CONSTRAINT grazing_moves_time_order CHECK (ends_at > starts_at)');
	await knex.raw('ALTER TABLE grazing_moves ADD CONSTRAINT grazing_moves_stretch_order CHECK (from_ft >= 0 AND to_ft > from_ft)');
}

export async function down(knex: Knex) {
	for (const t of ['grazing_moves', 'livestock_events', 'livestock_groups']) {
		await knex.schema.dropTableIfExists(t);
	}
}

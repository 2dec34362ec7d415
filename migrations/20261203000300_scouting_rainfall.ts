import type { Knex } from 'knex';

// Scouting notes (a point in a lane, what was seen, stand counts), the photos and other files
// attached to records, and rainfall: the farm's gauges and one reading per gauge per day.
// A note keeps a copy of its lane as it stood when the note was written, because a plan's lanes
// are rewritten when it is laid out again.
export async function up(knex: Knex) {
	const stamps = (t: Knex.CreateTableBuilder) => {
		t.integer('version').notNullable().defaultTo(1);
		t.uuid('created_by').references('users.id').onDelete('SET NULL');
		t.uuid('updated_by').references('users.id').onDelete('SET NULL');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('deleted_at', { useTz: true });
		t.uuid('deleted_by').references('users.id').onDelete('SET NULL');
	};

	await knex.schema.createTable('scouting_notes', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.uuid('field_id').notNullable().references('fields.id').onDelete('CASCADE');
		t.integer('season').notNullable();
		t.uuid('plan_id').references('plans.id').onDelete('SET NULL');
		t.integer('plan_version');
		// The lane as it stood when the note was written.
		t.integer('lane_index').notNullable();
		t.text('lane_kind').notNullable();
		t.text('lane_crop').notNullable();
		t.text('lane_variety');
		t.jsonb('location').notNullable(); // GeoJSON Point, WGS84
		t.decimal('position_ft', 12, 2); // distance along the lane from its start, when given that way
		t.timestamp('observed_at', { useTz: true }).notNullable();
		t.text('growth_stage');
		t.text('pests');
		t.text('diseases');
		t.text('weeds');
		t.integer('plants_counted');
		t.decimal('row_feet_counted', 10, 3);
		t.decimal('row_spacing_in', 6, 2);
		t.decimal('plants_per_acre', 12, 1); // worked out when the count was recorded
		t.text('notes');
		t.text('author_name'); // as the author was called when the note was written
		stamps(t);
		t.index(['farm_id', 'field_id', 'season']);
	});
	await knex.raw(`ALTER TABLE scouting_notes ADD CONSTRAINT scouting_notes_stand_count CHECK (
		(plants_counted IS NULL AND row_feet_counted IS NULL AND plants_per_acre IS NULL)
		OR (plants_counted >= 0 AND row_feet_counted > 0 AND row_spacing_in > 0 AND plants_per_acre >= 0))`);

	await knex.schema.createTable('attachments', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.text('entity').notNullable(); // what it is attached to, e.g. scouting_note
		t.uuid('entity_id').notNullable();
		t.uuid('field_id').references('fields.id').onDelete('CASCADE'); // who may see it follows the field
		t.text('storage_key').notNullable().unique(); // the display copy
		t.text('thumb_key'); // the small copy for lists
		t.text('content_type').notNullable();
		t.integer('byte_size').notNullable(); // of the display copy
		t.integer('width');
		t.integer('height');
		t.integer('original_byte_size').notNullable();
		t.text('original_name');
		t.uuid('created_by').references('users.id').onDelete('SET NULL');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('deleted_at', { useTz: true });
		t.uuid('deleted_by').references('users.id').onDelete('SET NULL');
		t.index(['farm_id', 'entity', 'entity_id']);
	});

	await knex.schema.createTable('rain_gauges', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.text('name').notNullable();
		t.jsonb('location').notNullable(); // GeoJSON Point, WGS84
		t.uuid('field_id').references('fields.id').onDelete('SET NULL');
		t.text('notes');
		stamps(t);
		t.index(['farm_id']);
	});
	await knex.raw('CREATE UNIQUE INDEX rain_gauges_name_key ON rain_gauges (farm_id, lower(name)) WHERE deleted_at IS NULL');

	await knex.schema.createTable('rainfall_readings', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.uuid('gauge_id').notNullable().references('rain_gauges.id').onDelete('CASCADE');
		t.date('reading_date').notNullable(); // a calendar day in the farm's time zone
		t.decimal('inches', 6, 2).notNullable();
		t.text('notes');
		stamps(t);
		t.index(['farm_id', 'reading_date']);
	});
	await knex.raw('CREATE UNIQUE INDEX rainfall_readings_day_key ON rainfall_readings (gauge_id, reading_date) WHERE deleted_at IS NULL');
	await knex.raw('ALTER TABLE rainfall_readings ADD CONSTRAINT rainfall_readings_inches_range CHECK (inches >= 0 AND inches <= 50)');
}

export async function down(knex: Knex) {
	for (const t of ['rainfall_readings', 'rain_gauges', 'attachments', 'scouting_notes']) {
		await knex.schema.dropTableIfExists(t);
	}
}

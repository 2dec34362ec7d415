import type { Knex } from 'knex';

// Harvest: weighed loads per lane (or part of a lane, or its outside or inside rows), and yield-monitor
// files summarised per lane. Like the record book, each entry keeps a copy of its lanes as they stood
// when it was logged (crop, rows, border rows, variety, trial label, outline): plan lanes are rewritten
// on every save, and season-over-season comparisons follow these stored outlines.
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

	await knex.schema.createTable('harvest_entries', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.uuid('field_id').notNullable().references('fields.id').onDelete('CASCADE');
		t.integer('season').notNullable();
		t.uuid('plan_id').references('plans.id').onDelete('SET NULL');
		t.integer('plan_version');
		t.text('crop').notNullable();
		t.text('row_position').notNullable().defaultTo('all').checkIn(['all', 'outside', 'inside']);
		t.date('harvested_on');
		t.decimal('wet_weight_lb', 14, 2).notNullable();
		t.decimal('moisture_pct', 6, 2).notNullable();
		t.decimal('length_ft', 12, 2);
		t.integer('rows');
		t.decimal('row_spacing_in', 8, 2);
		t.decimal('harvested_acres', 12, 6).notNullable();
		// The crop's standard as used for this entry, so a later change of standards never moves it.
		t.decimal('standard_moisture_pct', 6, 2).notNullable();
		t.decimal('pounds_per_bushel', 6, 2).notNullable();
		t.decimal('bushels', 14, 4).notNullable();
		t.decimal('bushels_per_acre', 12, 4).notNullable();
		t.text('notes');
		common(t);
		t.index(['farm_id', 'field_id', 'season']);
	});
	await knex.raw(`ALTER TABLE harvest_entries ADD CONSTRAINT harvest_entries_values CHECK (
		wet_weight_lb > 0 AND moisture_pct >= 5 AND moisture_pct <= 40 AND harvested_acres > 0
		AND (length_ft IS NULL OR length_ft > 0) AND (rows IS NULL OR rows > 0) AND (row_spacing_in IS NULL OR row_spacing_in > 0))`);

	await knex.schema.createTable('harvest_entry_lanes', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.uuid('entry_id').notNullable().references('harvest_entries.id').onDelete('CASCADE');
		t.integer('lane_index').notNullable();
		t.text('kind').notNullable();
		t.text('crop').notNullable();
		t.decimal('lane_acres', 12, 6).notNullable();
		t.decimal('width_ft', 10, 4).notNullable();
		t.integer('rows').notNullable();
		t.integer('border_rows').notNullable();
		t.text('variety');
		t.text('trial_label');
		t.jsonb('geometry').notNullable();
		t.unique(['entry_id', 'lane_index']);
		t.index(['farm_id']);
	});

	// A yield monitor's columns, named once per source (a combine, a display, an export format).
	await knex.schema.createTable('yield_column_mappings', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.text('source_name').notNullable();
		t.jsonb('mapping').notNullable();
		t.uuid('updated_by').references('users.id').onDelete('SET NULL');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['farm_id']);
	});
	await knex.raw('CREATE UNIQUE INDEX yield_column_mappings_source_key ON yield_column_mappings (farm_id, lower(source_name))');

	await knex.schema.createTable('yield_imports', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.uuid('field_id').notNullable().references('fields.id').onDelete('CASCADE');
		t.integer('season').notNullable();
		t.uuid('plan_id').references('plans.id').onDelete('SET NULL');
		t.integer('plan_version');
		t.text('crop');
		t.text('source_name').notNullable();
		t.text('file_name').notNullable();
		t.integer('file_bytes').notNullable();
		t.specificType('headers', 'text[]').notNullable();
		t.jsonb('mapping');
		t.text('status').notNullable().checkIn(['needs_mapping', 'queued', 'running', 'done', 'failed']);
		t.decimal('progress', 5, 4).notNullable().defaultTo(0);
		// points read, kept, outside every lane, and dropped by each documented rule
		t.jsonb('counts').notNullable().defaultTo('{}');
		// per lane: lane copy (index, crop, variety, trial label, acres) with mean, count, coverage
		t.jsonb('lane_summaries').notNullable().defaultTo('[]');
		t.text('error');
		t.timestamp('started_at', { useTz: true });
		t.timestamp('finished_at', { useTz: true });
		common(t);
		t.index(['farm_id', 'field_id', 'season']);
	});

	// The uploaded file, kept until a worker has read it; separate so lists never drag it along.
	await knex.schema.createTable('yield_import_files', (t) => {
		t.uuid('import_id').primary().references('yield_imports.id').onDelete('CASCADE');
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.binary('content').notNullable();
	});
}

export async function down(knex: Knex) {
	for (const t of ['yield_import_files', 'yield_imports', 'yield_column_mappings', 'harvest_entry_lanes', 'harvest_entries']) {
		await knex.schema.dropTableIfExists(t);
	}
}

import type { Knex } from 'knex';

// The season record book: the farm's product list, its seed catalogue, and operations logged
// lane by lane. A record keeps a copy of each lane as it stood when the work was logged
// (index, crop, acres, outline), because a plan's lanes are rewritten when it is laid out again,
// and what was recorded must never move.
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

	await knex.schema.createTable('products', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.text('name').notNullable();
		t.text('kind').notNullable().checkIn(['herbicide', 'insecticide', 'fungicide', 'fertilizer', 'seed-treatment', 'other']);
		t.text('unit').notNullable(); // what a rate is measured in: pt, qt, gal, fl oz, oz, lb, ton
		t.text('epa_reg_no');
		t.text('active_ingredients');
		t.boolean('restricted_use').notNullable().defaultTo(false);
		t.decimal('rei_hours', 8, 2);
		t.integer('phi_days');
		t.integer('grazing_days');
		t.text('formulation');
		t.text('analysis'); // fertilizer grade, e.g. 32-0-0
		t.decimal('pounds_per_gallon', 8, 4); // density the farm enters for liquids
		t.text('notes');
		common(t);
		t.index(['farm_id']);
	});
	await knex.raw('CREATE UNIQUE INDEX products_name_key ON products (farm_id, lower(name)) WHERE deleted_at IS NULL');
	await knex.raw('ALTER TABLE products ADD CONSTRAINT products_intervals_nonnegative CHECK ((rei_hours IS NULL OR rei_hours >= 0) AND (phi_days IS NULL OR phi_days >= 0) AND (grazing_days IS NULL OR grazing_days >= 0))');

	await knex.schema.createTable('varieties', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.text('crop').notNullable();
		t.text('name').notNullable();
		t.decimal('relative_maturity', 6, 1);
		t.integer('seeds_per_unit');
		t.text('traits');
		t.text('notes');
		common(t);
		t.index(['farm_id']);
	});
	await knex.raw('CREATE UNIQUE INDEX varieties_name_key ON varieties (farm_id, lower(crop), lower(name)) WHERE deleted_at IS NULL');

	await knex.schema.createTable('seed_lots', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.uuid('variety_id').notNullable().references('varieties.id').onDelete('CASCADE');
		t.text('lot_number').notNullable();
		t.decimal('germination_pct', 5, 2);
		t.text('treatment');
		t.decimal('units_on_hand', 12, 2);
		t.text('notes');
		common(t);
		t.index(['farm_id', 'variety_id']);
	});

	await knex.schema.createTable('operations', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.uuid('field_id').notNullable().references('fields.id').onDelete('CASCADE');
		t.integer('season').notNullable();
		// The adopted plan the lanes were taken from, and its version at the time.
		t.uuid('plan_id').references('plans.id').onDelete('SET NULL');
		t.integer('plan_version');
		t.text('type').notNullable().checkIn(['tillage', 'planting', 'fertilizer', 'spraying', 'cover-seeding', 'replant', 'mowing', 'other']);
		t.timestamp('started_at', { useTz: true }).notNullable();
		t.timestamp('ended_at', { useTz: true }).notNullable();
		t.decimal('acres', 12, 4).notNullable();
		t.text('applicator');
		t.text('applicator_cert_number');
		t.uuid('equipment_id').references('equipment.id').onDelete('SET NULL');
		t.text('equipment_name'); // as it was called when the work was logged
		t.decimal('temp_f', 6, 1);
		t.decimal('wind_mph', 6, 1);
		t.text('wind_from');
		t.jsonb('details').notNullable().defaultTo('{}'); // type-specific: variety, population, depth, placement, cover mix …
		t.text('notes');
		common(t);
		t.index(['farm_id', 'field_id', 'season']);
	});
	await knex.raw('ALTER TABLE operations ADD CONSTRAINT operations_time_order CHECK (ended_at >= started_at)');

	await knex.schema.createTable('operation_lanes', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.uuid('operation_id').notNullable().references('operations.id').onDelete('CASCADE');
		t.integer('lane_index').notNullable();
		t.text('kind').notNullable();
		t.text('crop').notNullable();
		t.decimal('lane_acres', 12, 6).notNullable(); // the whole lane, as stored in the plan
		t.decimal('acres', 12, 6).notNullable(); // the part of it this record covers
		t.decimal('from_ft', 12, 2); // part of a lane: distance along it, from … to
		t.decimal('to_ft', 12, 2);
		t.jsonb('geometry').notNullable();
		t.unique(['operation_id', 'lane_index']);
		t.index(['farm_id']);
	});

	await knex.schema.createTable('operation_products', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('farm_id').notNullable().references('farms.id').onDelete('CASCADE');
		t.uuid('operation_id').notNullable().references('operations.id').onDelete('CASCADE');
		t.uuid('product_id').notNullable().references('products.id').onDelete('RESTRICT');
		t.integer('position').notNullable();
		t.decimal('rate', 14, 4).notNullable();
		t.text('rate_unit').notNullable();
		t.decimal('total', 16, 4).notNullable();
		t.text('total_unit').notNullable();
		// Label data as it stood when the work was logged: a later edit of the product does not
		// change the intervals already running on a lane.
		t.text('product_name').notNullable();
		t.text('epa_reg_no');
		t.boolean('restricted_use').notNullable();
		t.decimal('rei_hours', 8, 2);
		t.integer('phi_days');
		t.integer('grazing_days');
		t.unique(['operation_id', 'position']);
		t.index(['farm_id', 'product_id']);
	});
	await knex.raw('ALTER TABLE operation_products ADD CONSTRAINT operation_products_rate_positive CHECK (rate > 0)');
}

export async function down(knex: Knex) {
	for (const t of ['operation_products', 'operation_lanes', 'operations', 'seed_lots', 'varieties', 'products']) {
		await knex.schema.dropTableIfExists(t);
	}
}

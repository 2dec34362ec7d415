import knexFactory, { type Knex } from 'knex';
import pg from 'pg';

// numeric stays exact in the database; read it as a JS number at the edge (20 significant
// digits are far beyond any field measurement we store).
pg.types.setTypeParser(pg.types.builtins.NUMERIC, (v) => (v === null ? null : Number(v)));
pg.types.setTypeParser(pg.types.builtins.INT8, (v) => (v === null ? null : Number(v)));

let instance: Knex | undefined;

/** The one Knex instance of this process (lazily created from DATABASE_URL). */
export function db(): Knex {
	if (!instance) {
		const url = process.env.DATABASE_URL;
		if (!url) throw new Error('DATABASE_URL is not set: start the app with `npm start` or set it (see README.md).');
		instance = knexFactory({ client: 'pg', connection: url, pool: { min: 0, max: 10 } });
	}
	return instance;
}

export async function closeDb() {
	await instance?.destroy();
	instance = undefined;
}

export type Trx = Knex.Transaction;

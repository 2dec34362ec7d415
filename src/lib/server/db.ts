import { AsyncLocalStorage } from 'node:async_hooks';
import knexFactory, { type Knex } from 'knex';
import pg from 'pg';

// numeric stays exact in the database; read it as a JS number at the edge (20 significant
// digits are far beyond any field measurement we store).
pg.types.setTypeParser(pg.types.builtins.NUMERIC, (v) => (v === null ? null : Number(v)));
pg.types.setTypeParser(pg.types.builtins.INT8, (v) => (v === null ? null : Number(v)));

let instance: Knex | undefined;

// Set while a transaction's callback runs. A query on the pool from inside it waits for a second
// connection while holding one; enough such requests at once hold every connection and wait for
// another, and the pool freezes until its acquire timeout. So db() refuses there: pass the trx.
const insideTransaction = new AsyncLocalStorage<true>();

function refusePoolInsideTransactions(knex: Knex): Knex {
	const begin = knex.transaction.bind(knex) as (...args: unknown[]) => unknown;
	Object.defineProperty(knex, 'transaction', {
		configurable: true,
		value: (scope?: unknown, config?: unknown) =>
			typeof scope === 'function'
				? begin((trx: Knex.Transaction) => insideTransaction.run(true, () => scope(trx)), config)
				: begin(scope, config)
	});
	return knex;
}

/** The one Knex instance of this process (lazily created from DATABASE_URL). */
export function db(): Knex {
	if (insideTransaction.getStore()) {
		throw new Error('db() was called inside a transaction: run every query of the transaction on its trx, not on a second pool connection.');
	}
	if (!instance) {
		const url = process.env.DATABASE_URL;
		if (!url) throw new Error('DATABASE_URL is not set: start the app with `npm start` or set it (see README.md).');
		// A stopped database must answer 503 within seconds, not hold requests for Knex's default minute.
		instance = refusePoolInsideTransactions(knexFactory({ client: 'pg', connection: url, pool: { min: 0, max: 10 }, acquireConnectionTimeout: 5000 }));
	}
	return instance;
}

export async function closeDb() {
	await instance?.destroy();
	instance = undefined;
}

export type Trx = Knex.Transaction;

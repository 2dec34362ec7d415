import type { Knex } from 'knex';

const config: Knex.Config = {
	client: 'pg',
	connection: process.env.DATABASE_URL,
	migrations: { directory: './migrations', extension: 'ts', loadExtensions: ['.ts'] },
	seeds: { directory: './seeds', extension: 'ts', loadExtensions: ['.ts'] },
	pool: { min: 0, max: 10 }
};

export default config;

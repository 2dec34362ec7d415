// npm run backup writes a dump and the uploads; npm run restore brings both back exactly.
import { describe, expect, it, afterAll } from 'vitest';
import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { mkdtempSync, mkdirSync, readdirSync, readFileSync, writeFileSync, rmSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { tmpdir } from 'node:os';
import { randomBytes } from 'node:crypto';
import knexFactory, { type Knex } from 'knex';
import { db } from '$lib/server/db';
import { makeFarmWithTeam } from './helpers';

const run = promisify(execFile);
const sourceUrl = new URL(process.env.DATABASE_URL!);
const sourceDb = sourceUrl.pathname.slice(1);
const restoredDb = `${sourceDb.replace(/_test$/, '')}_restored_test`;
const scratch = mkdtempSync(join(tmpdir(), 'stripwright-backup-'));
let restored: Knex | null = null;

function urlFor(name: string) {
	const u = new URL(sourceUrl.toString());
	u.pathname = `/${name}`;
	return u.toString();
}

async function dropRestored() {
	await db().raw(`DROP DATABASE IF EXISTS "${restoredDb}" WITH (FORCE)`);
}

afterAll(async () => {
	await restored?.destroy();
	await dropRestored();
	rmSync(scratch, { recursive: true, force: true });
});

function filesUnder(dir: string, prefix = ''): string[] {
	return readdirSync(dir).flatMap((name) => {
		const path = join(dir, name);
		return statSync(path).isDirectory() ? filesUnder(path, `${prefix}${name}/`) : [`${prefix}${name}`];
	});
}

async function tableNames(q: Knex): Promise<string[]> {
	const rows = await q('pg_tables').where({ schemaname: 'public' }).orderBy('tablename').pluck('tablename');
	return rows as string[];
}

/** Every row of a table, in a stable order, as text (so numeric, jsonb and timestamps compare exactly). */
async function rowsOf(q: Knex, table: string): Promise<string[]> {
	const rows = await q.raw(`SELECT t::text AS row FROM "${table}" t ORDER BY t::text`);
	return rows.rows.map((r: { row: string }) => r.row);
}

describe('backup and restore', () => {
	it('round-trips every table row by row and every upload byte by byte', { timeout: 120_000 }, async () => {
		await makeFarmWithTeam(); // at least one farm, its members and audit rows
		const uploads = join(scratch, 'uploads');
		mkdirSync(join(uploads, 'farm-a', 'photos'), { recursive: true });
		const photo = randomBytes(64 * 1024);
		writeFileSync(join(uploads, 'farm-a', 'photos', 'one.jpg'), photo);
		writeFileSync(join(uploads, 'note.txt'), 'kept as is\n');

		const env = { ...process.env, DB_NAME: sourceDb, UPLOADS_DIR: uploads, BACKUP_DIR: join(scratch, 'backups') };
		const backup = await run('bash', ['scripts/backup.sh'], { env });
		const archive = backup.stdout.trim().split('\n').pop()!;
		expect(archive).toMatch(/stripwright-.*-\d{8}T\d{6}Z\.tar\.gz$/);
		expect(statSync(archive).size).toBeGreaterThan(photo.length / 2);

		await dropRestored();
		const restoredUploads = join(scratch, 'restored-uploads');
		await run('bash', ['scripts/restore.sh', archive], { env: { ...process.env, DB_NAME: restoredDb, UPLOADS_DIR: restoredUploads } });

		restored = knexFactory({ client: 'pg', connection: urlFor(restoredDb) });
		const tables = await tableNames(db());
		expect(tables).toContain('farms');
		expect(await tableNames(restored)).toEqual(tables);
		for (const table of tables) {
			const [want, got] = await Promise.all([rowsOf(db(), table), rowsOf(restored, table)]);
			expect({ table, rows: got }).toEqual({ table, rows: want });
		}
		expect(filesUnder(restoredUploads).sort()).toEqual(['farm-a/photos/one.jpg', 'note.txt']);
		expect(readFileSync(join(restoredUploads, 'farm-a', 'photos', 'one.jpg')).equals(photo)).toBe(true);
		expect(readFileSync(join(restoredUploads, 'note.txt'), 'utf8')).toBe('kept as is\n');

		// A second restore over the now-filled database is refused and changes nothing.
		const again = await run('bash', ['scripts/restore.sh', archive], { env: { ...process.env, DB_NAME: restoredDb, UPLOADS_DIR: join(scratch, 'other') } }).catch((e) => e);
		expect(again.code).toBe(1);
		expect(again.stderr).toContain('is not empty');
		expect(await rowsOf(restored, 'farms')).toEqual(await rowsOf(db(), 'farms'));
	});
});

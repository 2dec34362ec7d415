// The invented demo scenario, part 1: the farm and one sign-in per role. Idempotent: fixed ids,
// insert-if-missing, so running the seeds twice changes nothing.
import type { Knex } from 'knex';
import { hashPassword } from '../src/lib/server/password';

export const DEMO_FARM_ID = '5a1e0000-0000-4000-8000-00000000f001';
export const DEMO_PASSWORD = 'stripwright-demo';
export const DEMO_DOMAIN = 'demo.stripwright.test';

export const DEMO_PEOPLE = [
	{ id: '5a1e0000-0000-4000-8000-0000000000a1', role: 'owner', name: 'Avery (demo owner)' },
	{ id: '5a1e0000-0000-4000-8000-0000000000a2', role: 'manager', name: 'Rowan (demo manager)' },
	{ id: '5a1e0000-0000-4000-8000-0000000000a3', role: 'crew', name: 'Jesse (demo crew)' },
	{ id: '5a1e0000-0000-4000-8000-0000000000a4', role: 'advisor', name: 'Morgan (demo agronomist)' },
	{ id: '5a1e0000-0000-4000-8000-0000000000a5', role: 'viewer', name: 'Quinn (demo landlord)' }
] as const;

export async function seed(knex: Knex) {
	await knex('farms').insert({ id: DEMO_FARM_ID, name: 'Larkspur Ridge Farm (demo)' }).onConflict('id').ignore();
	let passwordHash: string | undefined;
	for (const p of DEMO_PEOPLE) {
		const email = `${p.role}@${DEMO_DOMAIN}`;
		const existing = await knex('users').where({ id: p.id }).first('id');
		if (!existing) {
			passwordHash ??= await hashPassword(DEMO_PASSWORD);
			await knex('users').insert({ id: p.id, email, name: p.name, password_hash: passwordHash });
		}
		await knex('memberships').insert({ farm_id: DEMO_FARM_ID, user_id: p.id, role: p.role }).onConflict(['farm_id', 'user_id']).ignore();
	}
}

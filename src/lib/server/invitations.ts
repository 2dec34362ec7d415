import { db } from './db';
import { generateToken, sha256Hex } from './tokens';
import { recordAudit } from './audit';
import { normalizeEmail } from './users';
import { can, ROLE_LABELS, ROLES, type Role } from '../permissions';

export const INVITATION_TTL_DAYS = 7;

export interface PendingInvitation {
	id: string;
	email: string;
	role: Role;
	expiresAt: Date;
	invitedBy: string | null;
}

export interface InvitationView {
	id: string;
	farmId: string;
	farmName: string;
	email: string;
	role: Role;
	invitedByName: string | null;
	expiresAt: Date;
}

export class InvitationError extends Error {}

/**
 * Who may invite whom: only members who manage members (owners) invite at all, and an owner role
 * is only ever handed out by an owner, so no lower role can mint someone above itself.
 */
export function mayInvite(inviter: Role, invited: Role): boolean {
	return can(inviter, 'manageFarm') && (invited !== 'owner' || inviter === 'owner');
}

/** Creates an invitation and returns the raw token for the link (only its hash is stored). */
export async function createInvitation(farmId: string, invitedBy: string, email: string, role: Role, now = new Date()) {
	const token = generateToken();
	const address = normalizeEmail(email);
	const inviter = await db()('memberships').where({ farm_id: farmId, user_id: invitedBy }).first('role');
	if (!inviter || !mayInvite(inviter.role, role)) {
		throw new InvitationError(
			role === 'owner'
				? 'Only an owner of this farm can invite another owner.'
				: `Your role on this farm (${inviter ? ROLE_LABELS[inviter.role as Role] : 'none'}) cannot invite members; ask an owner.`
		);
	}
	const existingMember = await db()('memberships as m')
		.join('users as u', 'u.id', 'm.user_id')
		.where('m.farm_id', farmId)
		.whereRaw('lower(u.email) = ?', [address])
		.first('u.id');
	if (existingMember) throw new InvitationError(`${address} is already a member of this farm.`);
	const invitation = await db().transaction(async (trx) => {
		// A new invitation to the same address replaces any still-open one.
		await trx('invitations').where({ farm_id: farmId, email: address }).whereNull('accepted_at').whereNull('revoked_at').update({ revoked_at: now });
		const [row] = await trx('invitations')
			.insert({
				farm_id: farmId,
				email: address,
				role,
				token_hash: sha256Hex(token),
				invited_by: invitedBy,
				expires_at: new Date(now.getTime() + INVITATION_TTL_DAYS * 86_400_000)
			})
			.returning(['id', 'expires_at']);
		await recordAudit(trx, { farmId, userId: invitedBy, entity: 'invitation', entityId: row.id, action: 'create', after: { email: address, role } });
		return row;
	});
	return { id: invitation.id as string, token, expiresAt: new Date(invitation.expires_at) };
}

export async function listPendingInvitations(farmId: string, now = new Date()): Promise<PendingInvitation[]> {
	const rows = await db()('invitations')
		.where({ farm_id: farmId })
		.whereNull('accepted_at')
		.whereNull('revoked_at')
		.where('expires_at', '>', now)
		.orderBy('created_at', 'desc')
		.select('id', 'email', 'role', 'expires_at', 'invited_by');
	return rows.map((r) => ({ id: r.id, email: r.email, role: r.role, expiresAt: r.expires_at, invitedBy: r.invited_by }));
}

export async function revokeInvitation(farmId: string, actorId: string, invitationId: string) {
	const n = await db()('invitations').where({ id: invitationId, farm_id: farmId }).whereNull('accepted_at').update({ revoked_at: new Date() });
	if (n) await recordAudit(db(), { farmId, userId: actorId, entity: 'invitation', entityId: invitationId, action: 'revoke' });
	return n > 0;
}

type InvitationRow = {
	id: string;
	farm_id: string;
	farm_name: string;
	email: string;
	role: Role;
	expires_at: Date;
	accepted_at: Date | null;
	revoked_at: Date | null;
	inviter: string | null;
	farm_deleted: Date | null;
};

function findInvitation(trx: ReturnType<typeof db>, token: string) {
	return trx('invitations as i')
		.join('farms as f', 'f.id', 'i.farm_id')
		.leftJoin('users as u', 'u.id', 'i.invited_by')
		.where('i.token_hash', sha256Hex(token))
		.first<InvitationRow | undefined>(
			'i.id', 'i.farm_id', 'f.name as farm_name', 'i.email', 'i.role', 'i.expires_at', 'i.accepted_at', 'i.revoked_at',
			'u.name as inviter', 'f.deleted_at as farm_deleted'
		);
}

function judge(row: InvitationRow | undefined, now: Date): InvitationView {
	if (!row || row.farm_deleted) throw new InvitationError('This invitation link is not valid. Ask the farm for a new one.');
	if (row.accepted_at) throw new InvitationError('This invitation has already been accepted. Sign in to open the farm.');
	if (row.revoked_at) throw new InvitationError('This invitation was withdrawn or replaced by a newer one. Ask the farm for a new link.');
	if (new Date(row.expires_at) <= now) throw new InvitationError('This invitation has expired (invitations last 7 days). Ask the farm for a new one.');
	return { id: row.id, farmId: row.farm_id, farmName: row.farm_name, email: row.email, role: row.role, invitedByName: row.inviter, expiresAt: new Date(row.expires_at) };
}

/** The invitation behind a link, or an InvitationError saying why it cannot be used. */
export async function getInvitation(token: string, now = new Date()): Promise<InvitationView> {
	return judge(await findInvitation(db(), token), now);
}

/** The refusal shown when a link is opened by an account other than the one invited. */
export function wrongAccountMessage(invitedEmail: string, signedInEmail: string): string {
	return `This invitation is for ${invitedEmail}, but you are signed in as ${signedInEmail}. Sign out, then sign in or create an account with ${invitedEmail} to accept it.`;
}

/**
 * Accepts for the signed-in user, whose e-mail must be the invited address (any case): a forwarded
 * or leaked link does not let another account join. The invitation is bound to the farm it was made
 * for; the user keeps a higher role if they already belong to the farm.
 */
export async function acceptInvitation(token: string, userId: string, now = new Date()): Promise<InvitationView> {
	return db().transaction(async (trx) => {
		const row = await findInvitation(trx, token).forUpdate('i');
		const view = judge(row, now);
		const account = await trx('users').where({ id: userId }).first('email');
		if (!account) throw new InvitationError('Sign in first to accept this invitation.');
		if (normalizeEmail(account.email) !== normalizeEmail(view.email)) throw new InvitationError(wrongAccountMessage(view.email, account.email));
		const existing = await trx('memberships').where({ farm_id: view.farmId, user_id: userId }).forUpdate().first('role');
		if (!existing) {
			await trx('memberships').insert({ farm_id: view.farmId, user_id: userId, role: view.role });
		} else if (ROLES.indexOf(view.role) < ROLES.indexOf(existing.role)) {
			await trx('memberships').where({ farm_id: view.farmId, user_id: userId }).update({ role: view.role, field_scope: null });
		}
		await trx('invitations').where({ id: view.id }).update({ accepted_at: now, accepted_by: userId });
		await recordAudit(trx, { farmId: view.farmId, userId, entity: 'invitation', entityId: view.id, action: 'accept', after: { role: view.role } });
		return view;
	});
}

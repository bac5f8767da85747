import 'server-only';
import type { Role } from '@/lib/roles';
import type { Db } from '@/lib/server/db';

export interface InvitationRow {
  id: string;
  organisation_id: string;
  email: string;
  role: Role;
  token_hash: string;
  invited_by: string | null;
  expires_at: Date;
  accepted_at: Date | null;
  accepted_by: string | null;
  revoked_at: Date | null;
  revoked_by: string | null;
  created_at: Date;
}

export async function insertInvitation(
  db: Db,
  inv: { organisationId: string; email: string; role: Role; tokenHash: string; invitedBy: string; expiresAt: Date },
) {
  const [row] = await db<InvitationRow>('invitations')
    .insert({
      organisation_id: inv.organisationId,
      email: inv.email,
      role: inv.role,
      token_hash: inv.tokenHash,
      invited_by: inv.invitedBy,
      expires_at: inv.expiresAt,
    })
    .returning('*');
  return row!;
}

/** Locks the row so two people clicking the same link cannot both accept it. */
export function getInvitationByTokenHashForUpdate(db: Db, tokenHash: string) {
  return db<InvitationRow>('invitations').where({ token_hash: tokenHash }).forUpdate().first();
}

export function getInvitationByTokenHash(db: Db, tokenHash: string) {
  return db('invitations as i')
    .join('organisations as o', 'o.id', 'i.organisation_id')
    .where('i.token_hash', tokenHash)
    .first<(InvitationRow & { organisation_name: string }) | undefined>('i.*', { organisation_name: 'o.name' });
}

export async function markInvitationAccepted(db: Db, id: string, userId: string) {
  await db('invitations').where({ id }).update({ accepted_at: db.fn.now(), accepted_by: userId });
}

export function listOpenInvitations(db: Db, organisationId: string) {
  return db<InvitationRow>('invitations')
    .where({ organisation_id: organisationId })
    .whereNull('accepted_at')
    .whereNull('revoked_at')
    .where('expires_at', '>', db.fn.now())
    .orderBy('created_at', 'desc')
    .select('id', 'email', 'role', 'expires_at', 'created_at');
}

/**
 * Serialises one inviter's invitations for the rest of the transaction, so two at once cannot both
 * slip under the daily allowance.
 */
export async function lockInviter(db: Db, userId: string) {
  await db.raw('select pg_advisory_xact_lock(hashtext(?))', [`invitations:${userId}`]);
}

/** How many invitations a person sent since a moment (revoked ones included), and the oldest of them. */
export async function countInvitationsSince(db: Db, userId: string, since: Date) {
  const row = await db('invitations')
    .where({ invited_by: userId })
    .where('created_at', '>', since)
    .first<{ count: string; oldest: Date | null }>(db.raw('count(*) as count'), db.raw('min(created_at) as oldest'));
  return { count: Number(row?.count ?? 0), oldest: row?.oldest ?? null };
}

export function getInvitationForUpdate(db: Db, organisationId: string, id: string) {
  return db<InvitationRow>('invitations').where({ id, organisation_id: organisationId }).forUpdate().first();
}

export async function markInvitationRevoked(db: Db, id: string, userId: string) {
  await db('invitations').where({ id }).update({ revoked_at: db.fn.now(), revoked_by: userId });
}

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
    .where('expires_at', '>', db.fn.now())
    .orderBy('created_at', 'desc')
    .select('id', 'email', 'role', 'expires_at', 'created_at');
}

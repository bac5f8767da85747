import 'server-only';
import { createHash, randomBytes } from 'node:crypto';
import { getEnv } from '@/lib/env';
import type { Role } from '@/lib/roles';
import { hashPassword } from '@/lib/server/auth/passwords';
import type { Member } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { linkMail, sendMail } from '@/lib/server/mail';
import {
  countInvitationsSince,
  getInvitationByTokenHash,
  getInvitationByTokenHashForUpdate,
  getInvitationForUpdate,
  insertInvitation,
  listOpenInvitations,
  lockInviter,
  markInvitationAccepted,
  markInvitationRevoked,
} from '@/lib/server/queries/invitations';
import { findMemberRoleByEmail, upsertMembership } from '@/lib/server/queries/organisations';
import { getUserByEmail, insertUser } from '@/lib/server/queries/users';

export const INVITATION_DAYS = 7;
const DAY_MS = 24 * 3600 * 1000;

const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');

export const listInvitations = (member: Member) => listOpenInvitations(db(), member.organisationId);

export async function createInvitation(member: Member, input: { email: string; role: Role }) {
  const existing = await findMemberRoleByEmail(db(), member.organisationId, input.email);
  if (existing) {
    throw new AppError('conflict', `${input.email} is already a member of ${member.organisationName}.`, {
      email: ['Already a member'],
    });
  }
  const token = randomBytes(32).toString('base64url');
  const expiresAt = new Date(Date.now() + INVITATION_DAYS * 24 * 3600 * 1000);
  const row = await db().transaction(async (trx) => {
    await lockInviter(trx, member.userId);
    // A rolling day: each invitation stops counting 24 hours after it was sent.
    const allowed = getEnv().INVITATIONS_PER_DAY;
    const recent = await countInvitationsSince(trx, member.userId, new Date(Date.now() - DAY_MS));
    if (recent.count >= allowed) {
      const wait = recent.oldest ? Math.max(1, Math.ceil((recent.oldest.getTime() + DAY_MS - Date.now()) / 1000)) : 3600;
      throw new AppError(
        'rate-limited',
        `You have sent ${allowed} invitations in the last 24 hours, the most one person may. Try again in ${Math.ceil(wait / 3600)} hour${wait > 3600 ? 's' : ''}.`,
        undefined,
        { 'Retry-After': String(wait) },
      );
    }
    return insertInvitation(trx, {
      organisationId: member.organisationId,
      email: input.email,
      role: input.role,
      tokenHash: hashToken(token),
      invitedBy: member.userId,
      expiresAt,
    });
  });
  const url = `${getEnv().NEXTAUTH_URL.replace(/\/$/, '')}/invite/${token}`;
  await sendMail(
    linkMail({
      to: input.email,
      subject: `You are invited to ${member.organisationName} on Vineward`,
      intro: `${member.name ?? member.email} invites you to join ${member.organisationName} on Vineward as ${input.role}.`,
      action: 'Accept the invitation',
      url,
      outro: `The link works once and expires in ${INVITATION_DAYS} days.`,
    }),
  );
  return { id: row.id, email: row.email, role: row.role, expiresAt: row.expires_at };
}

/** A manager takes back an invitation nobody accepted yet; its link stops working at once. */
export async function revokeInvitation(member: Member, id: string) {
  return db().transaction(async (trx) => {
    const inv = await getInvitationForUpdate(trx, member.organisationId, id);
    if (!inv || inv.revoked_at) throw new AppError('not-found', 'There is no pending invitation with that id in your organisation.');
    if (inv.accepted_at) throw new AppError('conflict', `${inv.email} has already accepted this invitation; change their membership instead.`);
    await markInvitationRevoked(trx, inv.id, member.userId);
    return { id: inv.id, email: inv.email, role: inv.role };
  });
}

function refuseUnusable(inv: { accepted_at: Date | null; revoked_at: Date | null; expires_at: Date } | undefined) {
  if (!inv) throw new AppError('not-found', 'This invitation link is not valid. Check that you opened the whole link.');
  if (inv.accepted_at) throw new AppError('gone', 'This invitation has already been used. Sign in instead, or ask your manager for a new one.');
  if (inv.revoked_at) throw new AppError('gone', 'This invitation was withdrawn by a manager. Ask them for a new one if you should still join.');
  if (inv.expires_at.getTime() < Date.now()) throw new AppError('gone', 'This invitation has expired. Ask your manager to send a new one.');
}

/** What the invitation page shows before the person accepts. */
export async function describeInvitation(token: string) {
  const inv = await getInvitationByTokenHash(db(), hashToken(token));
  refuseUnusable(inv);
  const user = await getUserByEmail(db(), inv!.email);
  return { email: inv!.email, role: inv!.role, organisationName: inv!.organisation_name, hasAccount: !!user };
}

export async function acceptInvitation(input: { token: string; name?: string; password?: string }) {
  return db().transaction(async (trx) => {
    const inv = await getInvitationByTokenHashForUpdate(trx, hashToken(input.token));
    refuseUnusable(inv);
    let user = await getUserByEmail(trx, inv!.email);
    const newAccount = !user;
    if (!user) {
      const fields: Record<string, string[]> = {};
      if (!input.name) fields.name = ['Enter your name'];
      if (!input.password) fields.password = ['Choose a password'];
      if (Object.keys(fields).length) throw new AppError('invalid-input', 'Tell us your name and choose a password.', fields);
      user = await insertUser(trx, {
        email: inv!.email,
        name: input.name,
        passwordHash: await hashPassword(input.password!),
        // The invitation link reached this address, which proves it.
        emailVerified: new Date(),
      });
    }
    await upsertMembership(trx, { organisationId: inv!.organisation_id, userId: user.id, role: inv!.role });
    await markInvitationAccepted(trx, inv!.id, user.id);
    return { email: user.email, organisationId: inv!.organisation_id, newAccount };
  });
}

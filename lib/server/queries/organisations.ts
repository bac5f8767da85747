import 'server-only';
import type { MemberView, MembershipView } from '@/lib/contracts/people';
import type { Role } from '@/lib/roles';
import type { Db } from '@/lib/server/db';

export interface OrganisationRow {
  id: string;
  name: string;
  unit_system: 'metric' | 'imperial';
  keep_photo_location: boolean;
  season_start_month: number;
  created_at: Date;
}

export async function insertOrganisation(db: Db, org: { name: string; unitSystem?: 'metric' | 'imperial' }) {
  const [row] = await db<OrganisationRow>('organisations')
    .insert({ name: org.name, unit_system: org.unitSystem ?? 'metric' })
    .returning('*');
  return row!;
}

export function getOrganisation(db: Db, id: string) {
  return db<OrganisationRow>('organisations').where({ id }).first();
}

export async function listMemberships(db: Db, userId: string): Promise<MembershipView[]> {
  return db('memberships as m').join('organisations as o', 'o.id', 'm.organisation_id').where('m.user_id', userId).orderBy('o.name').select({
    organisationId: 'o.id',
    organisationName: 'o.name',
    unitSystem: 'o.unit_system',
    seasonStartMonth: 'o.season_start_month',
    role: 'm.role',
  });
}

export async function upsertMembership(db: Db, m: { organisationId: string; userId: string; role: Role }) {
  await db('memberships')
    .insert({ organisation_id: m.organisationId, user_id: m.userId, role: m.role })
    .onConflict(['organisation_id', 'user_id'])
    .merge(['role']);
}

export function listMembers(db: Db, organisationId: string) {
  return db('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where('m.organisation_id', organisationId)
    .orderBy([{ column: 'm.role' }, { column: 'u.email' }])
    .select<MemberView<Date>[]>({
      userId: 'u.id',
      email: 'u.email',
      name: 'u.name',
      role: 'm.role',
      since: 'm.created_at',
    });
}

export function updateSeasonStartMonth(db: Db, organisationId: string, month: number) {
  return db('organisations').where({ id: organisationId }).update({ season_start_month: month });
}

/** The role of the member with this e-mail in the organisation, if they are one. */
export function findMemberRoleByEmail(db: Db, organisationId: string, email: string): Promise<{ role: string } | undefined> {
  return db('memberships as m').join('users as u', 'u.id', 'm.user_id').where({ 'm.organisation_id': organisationId, 'u.email': email }).first('m.role');
}

/**
 * People and organisations: what /api/me, /api/members, /api/invitations/**, /api/me/locale and
 * /api/organisations/current answer. The request schemas are in lib/validation/auth.ts.
 */
import type { Locale } from '@/i18n/locales';
import type { Role } from '@/lib/roles';

export interface MembershipView {
  organisationId: string;
  organisationName: string;
  unitSystem: 'metric' | 'imperial';
  /** 1–12: the month the organisation's seasons start in (lib/reports/season.ts). */
  seasonStartMonth: number;
  role: Role;
}

export interface Me {
  user: { id: string; email: string; name: string | null };
  organisation: { id: string; name: string; unitSystem: 'metric' | 'imperial' };
  role: Role;
  memberships: MembershipView[];
}

export interface MemberView<T = string> {
  userId: string;
  email: string;
  name: string | null;
  role: Role;
  since: T;
}

export interface MemberList {
  members: MemberView[];
}

/** An invitation not yet accepted, revoked or expired (the wire keeps the table's column names). */
export interface OpenInvitation<T = string> {
  id: string;
  email: string;
  role: Role;
  expires_at: T;
  created_at: T;
}

export interface InvitationList {
  invitations: OpenInvitation[];
}

export interface InvitationCreated {
  invitation: { id: string; email: string; role: Role; expiresAt: string };
}

export interface InvitationRevoked {
  invitation: { id: string; email: string; role: Role };
}

export interface InvitationAccepted {
  accepted: { email: string; organisationId: string; newAccount: boolean };
}

export interface LocaleChosen {
  locale: Locale;
}

export interface OrganisationChosen {
  organisation: MembershipView;
}

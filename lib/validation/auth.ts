import { z } from 'zod';
import { ROLES } from '@/lib/roles';

export const emailSchema = z.email('Enter a valid e-mail address').trim().toLowerCase().max(254);

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string().min(1, 'Enter your password').max(200),
});

export const invitationSchema = z.object({
  email: emailSchema,
  role: z.enum(ROLES, 'Choose a role'),
});

export const acceptInvitationSchema = z.object({
  token: z.string().min(20).max(200),
  // Only asked of people who have no Vineward account yet.
  name: z.string().trim().min(1, 'Enter your name').max(120).optional(),
  password: z.string().min(10, 'Use at least 10 characters').max(200).optional(),
});

export const switchOrganisationSchema = z.object({ organisationId: z.uuid() });

import { z } from 'zod';

import { teamRoles, type TeamRole } from './roles';

export type TeamMembership = { id: string; name: string; slug: string; role: TeamRole };

/** GET /api/me */
export type Me = {
  user: { id: string; name: string; email: string };
  teams: TeamMembership[];
};

export type TeamMember = {
  memberId: string;
  userId: string;
  name: string;
  email: string;
  role: TeamRole;
  joinedAt: string;
};

export type PendingInvitation = {
  id: string;
  email: string;
  role: TeamRole;
  expiresAt: string;
  invitedBy: string | null;
};

/** GET /api/teams/:teamId */
export type TeamDetail = {
  id: string;
  name: string;
  slug: string;
  myRole: TeamRole;
  members: TeamMember[];
  invitations: PendingInvitation[];
};

export const teamName = z
  .string({ error: 'Team name must be text.' })
  .trim()
  .min(2, 'Team name needs at least 2 characters.')
  .max(80, 'Team name must be at most 80 characters.');

export const inviteInput = z.strictObject({
  email: z.email({ error: 'Enter a valid e-mail address.' }).trim().toLowerCase(),
  role: z.enum(teamRoles, { error: 'Pick one of Owner, Lead, Engineer, Reviewer, Observer.' }),
});

/** Slug from a team name: lower-case words joined by hyphens plus a short random tail. */
export function teamSlug(name: string, tail: string): string {
  const base = name
    .toLowerCase()
    .normalize('NFKD')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 40);
  return `${base || 'team'}-${tail}`;
}

export type Activity = {
  id: string;
  kind: string;
  reviewId: string | null;
  actor: { id: string; name: string } | null;
  detail: Record<string, unknown>;
  createdAt: string;
};

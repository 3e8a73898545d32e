import { z } from 'zod';

import { teamRoles, type TeamRole } from './roles';
import { plainText } from './text';

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

/**
 * A pending invitation as a Team page shows it. Only roles that may invite see any; only
 * Owners see invitations to be Owner; `id` (what accepting needs) only where the viewer
 * may cancel it, else null.
 */
export type PendingInvitation = {
  id: string | null;
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

export const teamName = plainText({ label: 'Team name', min: 2, max: 80 });

/** What `teamSlug` makes: lower-case words and digits joined by single hyphens. */
export const teamSlugField = z
  .string({ error: 'Slug must be text.' })
  .max(60, 'Slug must be at most 60 characters.')
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'Slug may hold only lower-case letters, digits and single hyphens.');

/**
 * POST /api/auth/organization/create, as the app sends it. A Team has no logo and no
 * metadata in this product, so neither is accepted.
 */
export const createTeamInput = z.strictObject({
  name: teamName,
  slug: teamSlugField,
  keepCurrentActiveOrganization: z.boolean().optional(),
});

/** A role is exactly one of ours: never a list, never another library's role. */
export const teamRole = z.enum(teamRoles, { error: 'Pick one of Owner, Lead, Engineer, Reviewer, Observer.' });

export const inviteInput = z.strictObject({
  email: z.email({ error: 'Enter a valid e-mail address.' }).trim().toLowerCase(),
  role: teamRole,
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

/**
 * What an Activity line records, in the words of the live events (`resource:past-tense`).
 * A kind stored by an older version reads as plain words on the screen.
 */
export const activityKinds = [
  'review:created',
  'review:renamed',
  'review:summary-changed',
  'review:archived',
  'review:restored',
  // The live board (detail carries the review's and the candidate's names at the time).
  'basis:updated',
  'candidate:added',
  'candidate:renamed',
  'candidate:status-changed',
  'candidate:recomputed',
  'round:opened',
  'round:closed',
  'comment:posted',
  // Scores (detail carries the review's name and how many scores changed).
  'score:changed',
  // Files (detail carries the file's name).
  'file:added',
  'file:removed',
  // The decision record (detail carries the review's name and the revision number).
  'decision:updated',
  'decision:signed',
  'decision:reopened',
  // The site year (detail carries the review's name and the profile file's name).
  'site-year:updated',
  'site-year:removed',
  // The robustness check (detail carries the review's name, the samples and the seed).
  'robustness:started',
  'robustness:finished',
] as const;
export type ActivityKind = (typeof activityKinds)[number];

/** GET /api/invitations/:invitationId — what the holder of an invitation link may see before signing in. */
export type PublicInvitation = {
  id: string;
  teamName: string;
  email: string;
  role: TeamRole;
  /** Null when the inviter's account is gone. */
  inviterName: string | null;
  status: 'pending' | 'accepted' | 'rejected' | 'canceled' | 'expired';
  expiresAt: string;
};

export type Activity = {
  id: string;
  kind: ActivityKind;
  reviewId: string | null;
  actor: { id: string; name: string } | null;
  detail: Record<string, unknown>;
  createdAt: string;
};

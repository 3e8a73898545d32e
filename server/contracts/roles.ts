import { createAccessControl } from 'better-auth/plugins/access';
import { defaultStatements } from 'better-auth/plugins/organization/access';

/**
 * What a role may do, shared by the server guard and the app (to hide what a user
 * cannot do; the server still checks every request).
 */
export const statements = {
  ...defaultStatements,
  review: ['create', 'update', 'archive'],
  candidate: ['create', 'update', 'delete'],
  basis: ['update'],
  round: ['open', 'close'],
  comment: ['create'],
  vote: ['cast'],
  decision: ['edit', 'sign', 'reopen'],
  liveSession: ['gather'],
  score: ['cast'],
  file: ['upload', 'delete'],
  robustness: ['run', 'cancel'],
} as const;

export const accessControl = createAccessControl(statements);

export const teamRoles = ['owner', 'lead', 'engineer', 'reviewer', 'observer'] as const;
export type TeamRole = (typeof teamRoles)[number];

export const roleLabels: Record<TeamRole, string> = {
  owner: 'Owner',
  lead: 'Lead',
  engineer: 'Engineer',
  reviewer: 'Reviewer',
  observer: 'Observer',
};

/**
 * Engineers, Reviewers and the Lead comment, vote, score and attach files; the Owner runs the
 * Team, comments and attaches files. Deleting any file is the Lead's and Owner's (the person who
 * uploaded a file may delete their own: the files service checks that).
 */
const discuss = { comment: ['create'], vote: ['cast'], score: ['cast'] } as const;

export const roles = {
  owner: accessControl.newRole({
    organization: ['update', 'delete'],
    member: ['create', 'update', 'delete'],
    invitation: ['create', 'cancel'],
    review: ['create', 'update', 'archive'],
    candidate: ['create', 'update', 'delete'],
    basis: ['update'],
    round: ['open', 'close'],
    decision: ['edit', 'sign', 'reopen'],
    liveSession: ['gather'],
    comment: ['create'],
    file: ['upload', 'delete'],
    robustness: ['run', 'cancel'],
  }),
  lead: accessControl.newRole({
    review: ['create', 'update', 'archive'],
    candidate: ['create', 'update', 'delete'],
    basis: ['update'],
    round: ['open', 'close'],
    decision: ['edit', 'sign', 'reopen'],
    liveSession: ['gather'],
    file: ['upload', 'delete'],
    robustness: ['run', 'cancel'],
    ...discuss,
  }),
  engineer: accessControl.newRole({
    candidate: ['create', 'update', 'delete'],
    file: ['upload'],
    robustness: ['run'],
    ...discuss,
  }),
  reviewer: accessControl.newRole({ ...discuss, file: ['upload'] }),
  observer: accessControl.newRole({}),
} satisfies Record<TeamRole, unknown>;

export type Permission = { [K in keyof typeof statements]?: Array<(typeof statements)[K][number]> };

/** True when `role` (one of ours, exactly) grants `permission`; anything else grants nothing. */
export function roleAllows(role: string, permission: Permission): boolean {
  return isTeamRole(role) && roles[role].authorize(permission as never).success;
}

/**
 * The role a stored member role string stands for. better-auth can keep a comma-separated
 * list; the database allows exactly one of our five (constraint `member_role_is_ours`), so
 * anything else is not a role of ours.
 */
export function primaryRole(stored: string | null): TeamRole | undefined {
  return stored !== null && isTeamRole(stored) ? stored : undefined;
}

export function isTeamRole(value: string): value is TeamRole {
  return (teamRoles as readonly string[]).includes(value);
}

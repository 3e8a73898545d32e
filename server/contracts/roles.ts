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
  comment: ['create'],
  vote: ['cast'],
  decision: ['sign'],
  session: ['gather'],
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

const discuss = { comment: ['create'], vote: ['cast'] } as const;

export const roles = {
  owner: accessControl.newRole({
    organization: ['update', 'delete'],
    member: ['create', 'update', 'delete'],
    invitation: ['create', 'cancel'],
    review: ['create', 'update', 'archive'],
    candidate: ['create', 'update', 'delete'],
    decision: ['sign'],
    session: ['gather'],
    ...discuss,
  }),
  lead: accessControl.newRole({
    review: ['create', 'update', 'archive'],
    candidate: ['create', 'update', 'delete'],
    decision: ['sign'],
    session: ['gather'],
    ...discuss,
  }),
  engineer: accessControl.newRole({
    candidate: ['create', 'update', 'delete'],
    ...discuss,
  }),
  reviewer: accessControl.newRole({ ...discuss }),
  observer: accessControl.newRole({}),
} satisfies Record<TeamRole, unknown>;

export type Permission = { [K in keyof typeof statements]?: Array<(typeof statements)[K][number]> };

/** True when `role` (a member's role string, possibly comma-separated) grants `permission`. */
export function roleAllows(role: string, permission: Permission): boolean {
  return role
    .split(',')
    .map((r) => r.trim())
    .some((r) => {
      const granted = roles[r as TeamRole];
      return granted ? granted.authorize(permission as never).success : false;
    });
}

/**
 * The role a stored member role string stands for: better-auth keeps roles as a
 * comma-separated list; we give each member one, so the first is the one.
 */
export function primaryRole(stored: string | null): TeamRole | undefined {
  const first = (stored ?? '').split(',')[0]?.trim() ?? '';
  return isTeamRole(first) ? first : undefined;
}

export function isTeamRole(value: string): value is TeamRole {
  return (teamRoles as readonly string[]).includes(value);
}

import type { Role } from '../schemas/common.ts';

/**
 * The role matrix of PRODUCT.md (Roles), as data. Resources and their actions are written the way
 * better-auth's access control takes them (server/auth.ts builds its roles from this table), so the
 * server's routes, the organization plugin and the client's menus all read one source.
 */
export const statements = {
  case: ['view', 'schedule', 'cancel', 'close'],
  checks: ['run'],
  event: ['record'],
  report: ['edit', 'sign', 'addend'],
  review: ['view', 'annotate', 'grade', 'conclude', 'export'],
  unit: ['manageUsers', 'manageRooms', 'manageCatalogue'],
  audit: ['view'],
} as const;

type Statements = typeof statements;
export type Resource = keyof Statements;
export type Action = { [R in Resource]: `${R}.${Statements[R][number]}` }[Resource];

/**
 * How far a grant reaches: `all` of the unit's cases, or only the cases where the member is the case's
 * endoscopist (`own`). A missing entry is no grant.
 */
export type Scope = 'all' | 'own';

const recorder = {
  'case.view': 'all', 'case.schedule': 'all', 'case.cancel': 'all', 'case.close': 'all',
  'checks.run': 'all', 'event.record': 'all',
} as const satisfies Partial<Record<Action, Scope>>;

export const permissionMatrix: Record<Role, Partial<Record<Action, Scope>>> = {
  nurse: { ...recorder },
  endoscopist: {
    ...recorder,
    'report.edit': 'own', 'report.sign': 'own', 'report.addend': 'own',
    'review.view': 'own',
  },
  supervisor: {
    'case.view': 'all',
    'review.view': 'all', 'review.annotate': 'all', 'review.grade': 'all', 'review.conclude': 'all', 'review.export': 'all',
    'audit.view': 'all',
  },
  admin: {
    'case.view': 'all',
    'unit.manageUsers': 'all', 'unit.manageRooms': 'all', 'unit.manageCatalogue': 'all',
    'audit.view': 'all',
  },
};

/** Every action, in the order of `statements` (for tables and tests). */
export const actions: Action[] = (Object.keys(statements) as Resource[]).flatMap((r) =>
  statements[r].map((a) => `${r}.${a}` as Action),
);

/** The reach of a role's grant for an action, or null when the role may not do it at all. */
export function scopeOf(role: Role, action: Action): Scope | null {
  return permissionMatrix[role][action] ?? null;
}

/**
 * May `role` do `action`? Without `target`, answers for the role as such (an `own` grant counts); with
 * `target`, an `own` grant holds only when the member is the case's endoscopist.
 */
export function can(role: Role, action: Action, target?: { ownCase: boolean }): boolean {
  const scope = scopeOf(role, action);
  if (scope === null) return false;
  if (scope === 'own' && target) return target.ownCase;
  return true;
}

/** The roles that may do `action` (any scope). */
export function rolesFor(action: Action): Role[] {
  return (Object.keys(permissionMatrix) as Role[]).filter((r) => scopeOf(r, action) !== null);
}

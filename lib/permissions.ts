import { createAccessControl } from 'better-auth/plugins/access';
import { defaultStatements } from 'better-auth/plugins/organization/access';

/**
 * What each workspace role may do. better-auth's own statements (organization,
 * member, invitation, team, ac) are kept so its endpoints keep working;
 * ours cover the domain.
 */
export const statements = {
  ...defaultStatements,
  materials: ['create', 'read', 'update', 'retract'],
  sources: ['create', 'read', 'update', 'retract'],
  methods: ['create', 'read', 'update', 'retract'],
  measurements: ['create', 'read', 'update', 'retract'],
  calculations: ['create', 'read', 'update', 'retract'],
  imports: ['create', 'read', 'undo'],
  benchmarks: ['create', 'read', 'update', 'retract'],
  decisions: ['create', 'read', 'revert'],
  comments: ['create', 'read', 'resolve'],
  decks: ['create', 'read', 'update', 'delete'],
  members: ['read', 'invite', 'update-role', 'remove'],
  tokens: ['create', 'read', 'revoke'],
  /** network: which hosts webhooks may reach (private-network targets), an owner's decision. */
  settings: ['read', 'update', 'network'],
} as const;

export const ac = createAccessControl(statements);

const dataAll = ['create', 'read', 'update', 'retract'] as const;
const dataContribute = ['create', 'read', 'update'] as const;

export const roles = {
  owner: ac.newRole({
    organization: ['update', 'delete'],
    member: ['create', 'update', 'delete'],
    invitation: ['create', 'cancel'],
    team: ['create', 'update', 'delete'],
    ac: ['create', 'read', 'update', 'delete'],
    materials: [...dataAll],
    sources: [...dataAll],
    methods: [...dataAll],
    measurements: [...dataAll],
    calculations: [...dataAll],
    imports: ['create', 'read', 'undo'],
    benchmarks: [...dataAll],
    decisions: ['create', 'read', 'revert'],
    comments: ['create', 'read', 'resolve'],
    decks: ['create', 'read', 'update', 'delete'],
    members: ['read', 'invite', 'update-role', 'remove'],
    tokens: ['create', 'read', 'revoke'],
    settings: ['read', 'update', 'network'],
  }),
  curator: ac.newRole({
    invitation: ['create', 'cancel'],
    materials: [...dataAll],
    sources: [...dataAll],
    methods: [...dataAll],
    measurements: [...dataAll],
    calculations: [...dataAll],
    imports: ['create', 'read', 'undo'],
    benchmarks: [...dataAll],
    decisions: ['create', 'read', 'revert'],
    comments: ['create', 'read', 'resolve'],
    decks: ['create', 'read', 'update', 'delete'],
    members: ['read', 'invite'],
    tokens: ['create', 'read', 'revoke'],
    settings: ['read', 'update'],
  }),
  contributor: ac.newRole({
    materials: [...dataContribute],
    sources: [...dataContribute],
    methods: [...dataContribute],
    measurements: [...dataContribute],
    calculations: [...dataContribute],
    imports: ['create', 'read'],
    benchmarks: ['read'],
    decisions: ['read'],
    comments: ['create', 'read'],
    decks: ['create', 'read', 'update'],
    members: ['read'],
    tokens: ['create', 'read', 'revoke'],
    settings: ['read'],
  }),
  reviewer: ac.newRole({
    materials: ['read'],
    sources: ['read'],
    methods: ['read'],
    measurements: ['read'],
    calculations: ['read'],
    imports: ['read'],
    benchmarks: ['read'],
    decisions: ['read'],
    comments: ['create', 'read'],
    decks: ['create', 'read', 'update'],
    members: ['read'],
    tokens: [],
    settings: ['read'],
  }),
};

export type WorkspaceRole = keyof typeof roles;
export const WORKSPACE_ROLES = ['owner', 'curator', 'contributor', 'reviewer'] as const satisfies readonly WorkspaceRole[];

type Statements = typeof statements;
export type Resource = Exclude<keyof Statements, keyof typeof defaultStatements>;
/** A permission written as "resource:action", e.g. "materials:create". */
export type Permission = {
  [R in Resource]: `${R}:${Statements[R][number]}`;
}[Resource];

export function isWorkspaceRole(value: string): value is WorkspaceRole {
  return (WORKSPACE_ROLES as readonly string[]).includes(value);
}

/** Pure check used by requireMember and by the UI to hide controls a role cannot use. */
export function roleCan(role: string, permission: Permission): boolean {
  if (!isWorkspaceRole(role)) return false;
  const [resource, action] = permission.split(':') as [Resource, string];
  const result = roles[role].authorize({ [resource]: [action] } as never);
  return result.success;
}

export const ROLE_DESCRIPTIONS: Record<WorkspaceRole, string> = {
  owner: 'Everything, including members, roles and deleting the workspace.',
  curator: 'Manages data, benchmarks and decisions; invites members; sets thresholds.',
  contributor: 'Adds and edits materials, sources, methods, measurements, calculations and imports.',
  reviewer: 'Reads everything, comments and builds decks.',
};

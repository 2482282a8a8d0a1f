import { describe, expect, it } from 'vitest';
import { roleCan, roles, statements, WORKSPACE_ROLES, type Permission } from '@/lib/permissions';

const domain = Object.keys(statements).filter((r) => !['organization', 'member', 'invitation', 'team', 'ac'].includes(r)) as Array<keyof typeof statements>;

describe('workspace roles', () => {
  it('defines exactly our four roles', () => {
    expect(Object.keys(roles).sort()).toEqual([...WORKSPACE_ROLES].sort());
  });

  it('gives every role read access to every domain resource', () => {
    for (const role of WORKSPACE_ROLES) {
      for (const resource of domain) {
        if (resource === 'tokens' && role === 'reviewer') continue;
        const actions = statements[resource] as readonly string[];
        if (actions.includes('read')) expect(roleCan(role, `${resource}:read` as Permission), `${role} ${resource}`).toBe(true);
      }
    }
  });

  it('orders the roles: owner ⊇ curator ⊇ contributor ⊇ reviewer', () => {
    const all = domain.flatMap((r) => (statements[r] as readonly string[]).map((a) => `${r}:${a}` as Permission));
    const order = ['reviewer', 'contributor', 'curator', 'owner'] as const;
    for (let i = 1; i < order.length; i++) {
      for (const p of all) if (roleCan(order[i - 1], p)) expect(roleCan(order[i], p), `${order[i]} lacks ${p}`).toBe(true);
    }
  });

  it.each([
    ['reviewer', 'materials:create', false],
    ['reviewer', 'comments:create', true],
    ['reviewer', 'decks:create', true],
    ['contributor', 'imports:create', true],
    ['contributor', 'imports:undo', false],
    ['contributor', 'decisions:create', false],
    ['curator', 'decisions:create', true],
    ['curator', 'members:invite', true],
    ['curator', 'members:update-role', false],
    ['owner', 'members:update-role', true],
    ['owner', 'members:remove', true],
    ['owner', 'settings:network', true],
    ['curator', 'settings:network', false],
    ['curator', 'settings:update', true],
  ] as const)('%s → %s is %s', (role, permission, expected) => {
    expect(roleCan(role, permission)).toBe(expected);
  });

  it('refuses unknown roles', () => {
    expect(roleCan('admin', 'materials:read')).toBe(false);
    expect(roleCan('', 'materials:read')).toBe(false);
  });
});

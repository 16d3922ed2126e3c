import { describe, expect, it } from 'vitest';
import { hasRole, ROLES, roleRank } from '@/lib/roles';
import { checkMembership } from '@/lib/server/team/membership';
import { AppError } from '@/lib/server/http/errors';

const user = { id: 'u1', email: 'a@b.example', name: 'A' };
const ws = { id: 'w1', slug: 'acme', name: 'Acme' };

describe('roles', () => {
  it('orders viewer < analyst < owner', () => {
    expect(ROLES).toEqual(['viewer', 'analyst', 'owner']);
    expect(roleRank('viewer')).toBeLessThan(roleRank('analyst'));
    expect(roleRank('analyst')).toBeLessThan(roleRank('owner'));
  });
  it('a role includes the weaker ones and not the stronger', () => {
    expect(hasRole('owner', 'analyst')).toBe(true);
    expect(hasRole('analyst', 'analyst')).toBe(true);
    expect(hasRole('viewer', 'analyst')).toBe(false);
    expect(hasRole('analyst', 'owner')).toBe(false);
  });
});

describe('the guard decision', () => {
  it('lets a member with enough role through, with the workspace context', () => {
    const ctx = checkMembership(user, { ...ws, role: 'analyst' }, 'viewer');
    expect(ctx).toEqual({ user, workspace: ws, role: 'analyst' });
  });
  it('refuses a weaker role with 403', () => {
    try {
      checkMembership(user, { ...ws, role: 'viewer' }, 'analyst');
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(AppError);
      expect((e as AppError).status).toBe(403);
    }
  });
  it('answers a non-member with 404 so the workspace does not leak', () => {
    expect(() => checkMembership(user, null, 'viewer')).toThrowError(/not found/);
  });
});

import { assignableRoles, memberRows, type Member } from './member-rows';

const member = (userId: string, role: Member['role']): Member => ({
  userId,
  role,
  email: `${userId}@larchmere.example`,
  name: userId,
  since: '2026-01-01T00:00:00Z',
});
const MEMBERS = [member('owner1', 'owner'), member('admin1', 'admin'), member('viewer1', 'viewer')];

describe('assignableRoles', () => {
  it('lets only owners hand out ownership, and viewers nothing', () => {
    expect(assignableRoles('owner')).toEqual(['owner', 'admin', 'analyst', 'viewer']);
    expect(assignableRoles('admin')).toEqual(['admin', 'analyst', 'viewer']);
    expect(assignableRoles('analyst')).toEqual([]);
    expect(assignableRoles(undefined)).toEqual([]);
  });
});

describe('memberRows', () => {
  it('gives an admin control over non-owners other than themselves', () => {
    const rows = memberRows(MEMBERS, 'admin1', 'admin');
    expect(rows.map((r) => [r.member.userId, r.you, r.removable, r.roleChoices.length])).toEqual([
      ['owner1', false, false, 0],
      ['admin1', true, false, 0],
      ['viewer1', false, true, 3],
    ]);
  });

  it('gives a viewer no control at all', () => {
    expect(memberRows(MEMBERS, 'viewer1', 'viewer').some((r) => r.removable)).toBe(false);
  });

  it('lets an owner manage another owner', () => {
    const rows = memberRows([...MEMBERS, member('owner2', 'owner')], 'owner1', 'owner');
    expect(rows.find((r) => r.member.userId === 'owner2')?.roleChoices).toContain('owner');
  });
});

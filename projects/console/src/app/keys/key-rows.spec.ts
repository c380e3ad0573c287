import { filterKeyRows, keyRows, keyState, pageOf, sortKeyRows, type KeyInfo } from './key-rows';

const NOW = Date.parse('2026-06-15T12:00:00Z');

function key(over: Partial<KeyInfo>): KeyInfo {
  return {
    id: 'k1',
    label: 'tropline_bk_k1',
    kind: 'browser',
    name: 'Portal',
    scopes: ['compute', 'scenarios:read'],
    origins: ['https://portal.example'],
    createdAt: '2026-06-01T00:00:00Z',
    expiresAt: null,
    revokedAt: null,
    rotatedTo: null,
    lastUsedAt: null,
    ...over,
  };
}

describe('keyState', () => {
  it('reads revoked before expired, and a rotated key in its overlap as retiring', () => {
    expect(keyState(key({}), NOW)).toBe('active');
    expect(keyState(key({ rotatedTo: 'k2', expiresAt: '2026-06-16T00:00:00Z' }), NOW)).toBe(
      'retiring',
    );
    expect(keyState(key({ rotatedTo: 'k2', expiresAt: '2026-06-15T11:59:59Z' }), NOW)).toBe(
      'expired',
    );
    expect(
      keyState(key({ revokedAt: '2026-06-10T00:00:00Z', expiresAt: '2026-06-11T00:00:00Z' }), NOW),
    ).toBe('revoked');
  });
});

describe('keyRows', () => {
  it('marks only active keys as live and says a server key takes any origin', () => {
    const rows = keyRows(
      [key({}), key({ id: 'k2', kind: 'server', origins: [], revokedAt: '2026-06-02T00:00:00Z' })],
      NOW,
    );
    expect(rows.map((r) => [r.live, r.stateLabel, r.originsText])).toEqual([
      [true, 'Active', 'https://portal.example'],
      [false, 'Revoked', 'Any (server key)'],
    ]);
  });
});

describe('filterKeyRows', () => {
  const rows = keyRows(
    [
      key({ id: 'a', name: 'Public portal' }),
      key({ id: 'b', name: 'Nightly report', kind: 'server', origins: [], scopes: ['usage:read'] }),
      key({ id: 'c', name: 'Old portal', revokedAt: '2026-06-02T00:00:00Z' }),
    ],
    NOW,
  );
  const ids = (f: Parameters<typeof filterKeyRows>[1]) =>
    filterKeyRows(rows, f).map((r) => r.key.id);

  it('matches text in the name, scopes or origins, case-insensitively', () => {
    expect(ids({ text: 'PORTAL', state: 'all', kind: 'all' })).toEqual(['a', 'c']);
    expect(ids({ text: 'usage', state: 'all', kind: 'all' })).toEqual(['b']);
  });

  it('narrows by state and by kind', () => {
    expect(ids({ text: '', state: 'revoked', kind: 'all' })).toEqual(['c']);
    expect(ids({ text: '', state: 'all', kind: 'server' })).toEqual(['b']);
  });
});

describe('sortKeyRows', () => {
  const rows = keyRows(
    [
      key({ id: 'a', name: 'beta', lastUsedAt: '2026-06-10T00:00:00Z' }),
      key({ id: 'b', name: 'Alpha', lastUsedAt: null }),
      key({ id: 'c', name: 'gamma', lastUsedAt: '2026-06-12T00:00:00Z' }),
    ],
    NOW,
  );
  const ids = (col: Parameters<typeof sortKeyRows>[1], dir: 'asc' | 'desc' | '') =>
    sortKeyRows(rows, col, dir).map((r) => r.key.id);

  it('sorts names without regard to case, both ways', () => {
    expect(ids('name', 'asc')).toEqual(['b', 'a', 'c']);
    expect(ids('name', 'desc')).toEqual(['c', 'a', 'b']);
  });

  it('puts never-used keys after every date when ascending', () => {
    expect(ids('lastUsedAt', 'asc')).toEqual(['a', 'c', 'b']);
  });

  it('keeps the server order without a direction', () => {
    expect(ids('name', '')).toEqual(['a', 'b', 'c']);
  });
});

describe('pageOf', () => {
  it('cuts the asked page and an empty one past the end', () => {
    expect(pageOf([1, 2, 3, 4, 5], 1, 2)).toEqual([3, 4]);
    expect(pageOf([1, 2, 3], 3, 2)).toEqual([]);
  });
});

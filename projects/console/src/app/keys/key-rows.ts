/** A key as `GET /console/keys` lists it: everything but the secret. */
export interface KeyInfo {
  readonly id: string;
  readonly label: string;
  readonly kind: 'server' | 'browser';
  readonly name: string;
  readonly scopes: readonly string[];
  readonly origins: readonly string[];
  readonly createdAt: string;
  readonly expiresAt: string | null;
  readonly revokedAt: string | null;
  readonly rotatedTo: string | null;
  readonly lastUsedAt?: string | null;
}

/** A freshly issued (or rotated) key: the only time its plaintext is seen. */
export interface IssuedKey {
  readonly key: KeyInfo;
  readonly token: string;
  readonly previous?: { readonly id: string; readonly expiresAt: string };
}

/** Where a key stands: working, in its rotation overlap, past its expiry, or revoked. */
export type KeyState = 'active' | 'retiring' | 'expired' | 'revoked';

/** How each state reads on screen. */
export const KEY_STATE_LABELS: Readonly<Record<KeyState, string>> = {
  active: 'Active',
  retiring: 'Retiring (rotated)',
  expired: 'Expired',
  revoked: 'Revoked',
};

/** One row of the keys table. */
export interface KeyRow {
  readonly key: KeyInfo;
  readonly state: KeyState;
  /** Whether it may still be rotated or revoked. */
  readonly live: boolean;
  readonly stateLabel: string;
  readonly kindLabel: string;
  readonly scopesText: string;
  readonly originsText: string;
}

/** Columns the table can sort by. */
export type KeySortColumn = 'name' | 'kind' | 'createdAt' | 'lastUsedAt' | 'expiresAt' | 'state';

/** The table's filter: free text over name, prefix, scopes and origins, plus state and kind. */
export interface KeyFilter {
  readonly text: string;
  readonly state: KeyState | 'all';
  readonly kind: 'server' | 'browser' | 'all';
}

/** The state of a key at `now` (epoch ms). */
export function keyState(key: KeyInfo, now: number): KeyState {
  if (key.revokedAt) return 'revoked';
  if (key.expiresAt && Date.parse(key.expiresAt) <= now) return 'expired';
  return key.rotatedTo ? 'retiring' : 'active';
}

/** The rows of the keys table at `now`. */
export function keyRows(keys: readonly KeyInfo[], now: number): KeyRow[] {
  return keys.map((key) => {
    const state = keyState(key, now);
    return {
      key,
      state,
      live: state === 'active',
      stateLabel: KEY_STATE_LABELS[state],
      kindLabel: key.kind === 'browser' ? 'Browser' : 'Server',
      scopesText: key.scopes.join(', '),
      originsText: key.kind === 'browser' ? key.origins.join(', ') : 'Any (server key)',
    };
  });
}

/** Rows that pass the filter. */
export function filterKeyRows(rows: readonly KeyRow[], filter: KeyFilter): KeyRow[] {
  const needle = filter.text.trim().toLowerCase();
  return rows.filter(
    (r) =>
      (filter.state === 'all' || r.state === filter.state) &&
      (filter.kind === 'all' || r.key.kind === filter.kind) &&
      (!needle ||
        [r.key.name, r.key.label, r.scopesText, r.originsText].some((s) =>
          s.toLowerCase().includes(needle),
        )),
  );
}

const STATE_ORDER: Record<KeyState, number> = { active: 0, retiring: 1, expired: 2, revoked: 3 };

function sortValue(row: KeyRow, column: KeySortColumn): string | number {
  switch (column) {
    case 'name':
      return row.key.name.toLowerCase();
    case 'kind':
      return row.key.kind;
    case 'state':
      return STATE_ORDER[row.state];
    default:
      // Never used or never expiring sorts after every date.
      return row.key[column] ?? '\uffff';
  }
}

/** Rows sorted by one column; `''` keeps the server's order. Ties keep their order. */
export function sortKeyRows(
  rows: readonly KeyRow[],
  column: KeySortColumn | '',
  direction: 'asc' | 'desc' | '',
): KeyRow[] {
  if (!column || !direction) return [...rows];
  const sign = direction === 'asc' ? 1 : -1;
  return rows
    .map((row, i) => ({ row, i, v: sortValue(row, column) }))
    .sort((a, b) => (a.v < b.v ? -sign : a.v > b.v ? sign : a.i - b.i))
    .map((x) => x.row);
}

/** One page of rows. */
export function pageOf<T>(rows: readonly T[], pageIndex: number, pageSize: number): T[] {
  return rows.slice(pageIndex * pageSize, (pageIndex + 1) * pageSize);
}

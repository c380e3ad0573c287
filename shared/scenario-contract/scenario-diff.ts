import { escapePointerToken } from '../model/validation-issue';

/** One difference between two versions: where, and the value on each side (absent: undefined). */
export interface FieldChange {
  readonly pointer: string;
  readonly before?: unknown;
  readonly after?: unknown;
}

function isObject(v: unknown): v is Record<string, unknown> {
  return v !== null && typeof v === 'object' && !Array.isArray(v);
}

/**
 * Compares two JSON values field by field and lists every leaf that differs as a JSON Pointer
 * (RFC 6901), in document order: objects by key, arrays by index. Arrays of different length
 * report the extra elements as added or removed.
 */
export function diffDocuments(before: unknown, after: unknown, pointer = ''): FieldChange[] {
  if (isObject(before) && isObject(after)) {
    const keys = [...new Set([...Object.keys(before), ...Object.keys(after)])];
    return keys.flatMap((k) =>
      diffDocuments(before[k], after[k], `${pointer}/${escapePointerToken(k)}`),
    );
  }
  if (Array.isArray(before) && Array.isArray(after)) {
    const n = Math.max(before.length, after.length);
    return Array.from({ length: n }, (_, i) =>
      diffDocuments(before[i], after[i], `${pointer}/${i}`),
    ).flat();
  }
  if (JSON.stringify(before) === JSON.stringify(after)) return [];
  return [
    {
      pointer,
      ...(before === undefined ? {} : { before }),
      ...(after === undefined ? {} : { after }),
    },
  ];
}

/**
 * Field-id prefixes in use on the page, so that two parameter forms never give two fields the
 * same id (a label, a link or `aria-describedby` would then find the wrong field). The first
 * form with a prefix gets it as it is; another at the same time gets `<prefix>-2`, and so on.
 */
const inUse = new Set<string>();

/** Takes the prefix, or the first free numbered variant of it. */
export function claimIdPrefix(prefix: string): string {
  let claimed = prefix;
  for (let n = 2; inUse.has(claimed); n++) claimed = `${prefix}-${n}`;
  inUse.add(claimed);
  return claimed;
}

/** Gives a prefix back when its form goes away or changes prefix. */
export function releaseIdPrefix(prefix: string): void {
  inUse.delete(prefix);
}

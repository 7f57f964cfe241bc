/**
 * Pairs the items of two versions of a design (reaches, sections, linings, flows). Items are matched pass by
 * pass: first by name, then by weaker keys (the same reach name in another channel; an identical definition under
 * a new name, which is a rename). A pass only pairs keys that are unique among the still unmatched items on both
 * sides, so two look-alike reaches are never paired by guess.
 */

export interface MatchedPair<T> {
  readonly before: T;
  readonly after: T;
  /** Index of the pass that paired them: 0 is the primary key (same name), higher passes are renames. */
  readonly pass: number;
}

export interface MatchResult<T> {
  /** In the order of the new version. */
  readonly matched: readonly MatchedPair<T>[];
  readonly removed: readonly T[];
  readonly added: readonly T[];
}

function groupUnmatched<T>(items: readonly T[], taken: ReadonlySet<T>, key: (item: T) => string): Map<string, T[]> {
  const groups = new Map<string, T[]>();
  for (const item of items) {
    if (taken.has(item)) continue;
    const itemKey = key(item);
    const group = groups.get(itemKey);
    if (group) group.push(item);
    else groups.set(itemKey, [item]);
  }
  return groups;
}

/** Matches `before` to `after` by each key function in turn (see the file header). */
export function matchItems<T>(before: readonly T[], after: readonly T[], keys: readonly ((item: T) => string)[]): MatchResult<T> {
  const takenBefore = new Set<T>();
  const takenAfter = new Set<T>();
  const pairByAfter = new Map<T, MatchedPair<T>>();
  keys.forEach((key, pass) => {
    const beforeGroups = groupUnmatched(before, takenBefore, key);
    const afterGroups = groupUnmatched(after, takenAfter, key);
    for (const [itemKey, afterGroup] of afterGroups) {
      const beforeGroup = beforeGroups.get(itemKey);
      const onlyBefore = beforeGroup?.length === 1 ? beforeGroup[0] : undefined;
      const onlyAfter = afterGroup.length === 1 ? afterGroup[0] : undefined;
      if (onlyBefore === undefined || onlyAfter === undefined) continue;
      takenBefore.add(onlyBefore);
      takenAfter.add(onlyAfter);
      pairByAfter.set(onlyAfter, { before: onlyBefore, after: onlyAfter, pass });
    }
  });
  return {
    matched: after.flatMap((item) => {
      const pair = pairByAfter.get(item);
      return pair ? [pair] : [];
    }),
    removed: before.filter((item) => !takenBefore.has(item)),
    added: after.filter((item) => !takenAfter.has(item)),
  };
}

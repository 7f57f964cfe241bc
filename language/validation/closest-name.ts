/**
 * "Did you mean": the candidate nearest to a misspelt word, by edit distance (Damerau: a swap of two neighbouring
 * letters counts as one edit), accepted only when close enough to be a likely typo.
 */

/** The best suggestion for `written` among `candidates`, or undefined when none is close. */
export function closestName(written: string, candidates: Iterable<string>): string | undefined {
  let best: string | undefined;
  let bestDistance = Number.POSITIVE_INFINITY;
  const writtenLower = written.toLowerCase();
  for (const candidate of candidates) {
    if (candidate === written) continue;
    // A difference in letter case only is the likeliest slip of all.
    const distance = candidate.toLowerCase() === writtenLower ? 0.5 : editDistance(writtenLower, candidate.toLowerCase());
    if (distance < bestDistance) {
      bestDistance = distance;
      best = candidate;
    }
  }
  return best !== undefined && bestDistance <= allowedDistance(written) ? best : undefined;
}

/** Up to a third of the word's letters, at least one. */
function allowedDistance(word: string): number {
  return Math.max(1, Math.floor(word.length / 3));
}

/** Optimal string alignment distance (insertions, deletions, substitutions, adjacent transpositions). */
export function editDistance(left: string, right: string): number {
  const rows = left.length + 1;
  const columns = right.length + 1;
  const table: number[][] = Array.from({ length: rows }, (_, row) => Array.from({ length: columns }, (_, column) => (row === 0 ? column : column === 0 ? row : 0)));
  const at = (row: number, column: number): number => table[row]?.[column] ?? Number.POSITIVE_INFINITY;
  for (let row = 1; row < rows; row++) {
    for (let column = 1; column < columns; column++) {
      const cost = left[row - 1] === right[column - 1] ? 0 : 1;
      let value = Math.min(at(row - 1, column) + 1, at(row, column - 1) + 1, at(row - 1, column - 1) + cost);
      if (row > 1 && column > 1 && left[row - 1] === right[column - 2] && left[row - 2] === right[column - 1]) {
        value = Math.min(value, at(row - 2, column - 2) + 1);
      }
      const tableRow = table[row];
      if (tableRow !== undefined) tableRow[column] = value;
    }
  }
  return at(left.length, right.length);
}

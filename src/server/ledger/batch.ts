import "server-only";

/**
 * SQLite binds at most 32,766 variables in one statement; a blend of many blends into many
 * tanks can write tens of thousands of composition rows, so rows go in slices of 1,000.
 */
export function insertInChunks<T>(rows: T[], insert: (slice: T[]) => unknown, size = 1000) {
  for (let i = 0; i < rows.length; i += size) insert(rows.slice(i, i + size));
}

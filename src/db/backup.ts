import Database from "better-sqlite3";

/**
 * A consistent copy of a live database through SQLite's online backup API (better-sqlite3
 * `backup()`): readers and writers go on while the pages are copied, and the copy is a
 * complete database as of one moment.
 */
export async function backupDatabase(source: string, destination: string): Promise<{ pages: number }> {
  const db = new Database(source, { readonly: true, fileMustExist: true });
  try {
    const result = await db.backup(destination);
    return { pages: result.totalPages };
  } finally {
    db.close();
  }
}

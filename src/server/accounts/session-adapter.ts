import "server-only";
import { DrizzleSQLiteAdapter } from "@lucia-auth/adapter-drizzle";
import { eq, sql } from "drizzle-orm";
import type { DatabaseSession, DatabaseUser } from "lucia";
import type { Db } from "@/db/client";
import { sessions, users } from "@/db/schema";

/**
 * Lucia's Drizzle adapter, with the one lookup every signed-in request makes — session and
 * user by session id — built once as a prepared statement instead of on every request
 * (building a Drizzle query costs more than running it; `npm run bench:load`). It reads only
 * the user attributes the session carries (src/server/accounts/auth.ts): never the password hash.
 */
export class PreparedSessionAdapter extends DrizzleSQLiteAdapter {
  private readonly sessionAndUser;

  constructor(db: Db) {
    super(db, sessions, users);
    this.sessionAndUser = db
      .select({
        userId: sessions.userId,
        expiresAt: sessions.expiresAt,
        signedInAt: sessions.signedInAt,
        email: users.email,
        name: users.name,
        role: users.role,
        partyId: users.partyId,
        disabledAt: users.disabledAt,
        locale: users.locale,
      })
      .from(sessions)
      .innerJoin(users, eq(users.id, sessions.userId))
      .where(eq(sessions.id, sql.placeholder("id")))
      .prepare();
  }

  override async getSessionAndUser(sessionId: string): Promise<[DatabaseSession | null, DatabaseUser | null]> {
    const row = this.sessionAndUser.get({ id: sessionId });
    if (!row) return [null, null];
    const { userId, expiresAt, signedInAt, ...userAttributes } = row;
    return [
      { id: sessionId, userId, expiresAt: new Date(expiresAt * 1000), attributes: { signedInAt } },
      { id: userId, attributes: userAttributes },
    ];
  }
}

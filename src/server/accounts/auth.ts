import "server-only";
import { Lucia, TimeSpan } from "lucia";
import type { Role } from "@/domain/roles";
import type { Locale } from "@/i18n/locale";
import { getDb } from "../platform/db";
import { PreparedSessionAdapter } from "./session-adapter";

let instance: ReturnType<typeof createLucia> | undefined;
let instanceDb: unknown;

function createLucia() {
  const adapter = new PreparedSessionAdapter(getDb());
  return new Lucia(adapter, {
    sessionExpiresIn: new TimeSpan(12, "h"),
    sessionCookie: {
      name: "grainline_session",
      expires: false,
      // Secure is decided per request (https or not) where the cookie is written.
      attributes: { sameSite: "lax", secure: false },
    },
    getSessionAttributes: (row) => ({ signedInAt: row.signedInAt }),
    getUserAttributes: (row) => ({
      email: row.email,
      name: row.name,
      role: row.role,
      partyId: row.partyId,
      disabledAt: row.disabledAt,
      locale: row.locale,
    }),
  });
}

export function lucia() {
  // The adapter holds prepared statements of one connection; a new connection needs a new one.
  if (!instance || instanceDb !== getDb()) {
    instanceDb = getDb();
    instance = createLucia();
  }
  return instance;
}

declare module "lucia" {
  interface Register {
    Lucia: ReturnType<typeof createLucia>;
    // Unix seconds (src/server/accounts/session-token.ts: the absolute lifetime counts from it).
    DatabaseSessionAttributes: { signedInAt: number };
    DatabaseUserAttributes: {
      email: string;
      name: string;
      role: Role;
      partyId: string;
      disabledAt: Date | null;
      locale: Locale | null;
    };
  }
}

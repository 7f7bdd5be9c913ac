import "server-only";
import { DrizzleSQLiteAdapter } from "@lucia-auth/adapter-drizzle";
import { Lucia, TimeSpan } from "lucia";
import { sessions, users } from "@/db/schema";
import type { Role } from "@/domain/roles";
import { getDb } from "./db";

let instance: ReturnType<typeof createLucia> | undefined;

function createLucia() {
  const adapter = new DrizzleSQLiteAdapter(getDb(), sessions, users);
  return new Lucia(adapter, {
    sessionExpiresIn: new TimeSpan(12, "h"),
    sessionCookie: {
      name: "grainline_session",
      expires: false,
      // Secure is decided per request (https or not) where the cookie is written.
      attributes: { sameSite: "lax", secure: false },
    },
    getUserAttributes: (row) => ({
      email: row.email,
      name: row.name,
      role: row.role,
      partyId: row.partyId,
      disabledAt: row.disabledAt,
    }),
  });
}

export function lucia() {
  instance ??= createLucia();
  return instance;
}

declare module "lucia" {
  interface Register {
    Lucia: ReturnType<typeof createLucia>;
    DatabaseUserAttributes: {
      email: string;
      name: string;
      role: Role;
      partyId: string;
      disabledAt: Date | null;
    };
  }
}

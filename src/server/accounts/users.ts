import "server-only";
import { and, asc, eq, gt, isNull } from "drizzle-orm";
import { generateIdFromEntropySize } from "lucia";
import type { DbOrTx } from "@/db/client";
import { parties, passwordTokens, users } from "@/db/schema";
import { PARTY_KIND_FOR_ROLE } from "@/domain/roles";
import { canManageUsers } from "@/domain/permissions";
import type { Locale } from "@/i18n/locale";
import type { InviteInput } from "@/lib/validation/people";
import type { Translate } from "@/lib/validation/field-errors";
import { recordAudit } from "../records/audit";
import { lucia } from "./auth";
import { getDb } from "../platform/db";
import { AppError, forbidden, invalid } from "../platform/errors";
import { mailTranslator, sendMail } from "../platform/mail";
import { burnPasswordCheck, hashPassword, verifyPassword } from "./passwords";
import type { SessionUser } from "./session";
import { openSession } from "./session-token";
import { attemptWaitMs, clearSignInFailures, countAttempt, mustWait, recordSignInFailure, signInWaitMs } from "./throttle";
import { INVITE_TTL_MS, RESET_TTL_MS, hashLinkToken, newLinkToken } from "./tokens";

export type PublicUser = { id: string; email: string; name: string; role: SessionUser["role"]; partyId: string };

const toPublic = (u: typeof users.$inferSelect): PublicUser => ({
  id: u.id,
  email: u.email,
  name: u.name,
  role: u.role,
  partyId: u.partyId,
});

/**
 * Checks a password and opens a new session. Throttled per account and client (a growing
 * wait), and per client: one client's wrong guesses never hold back anyone else's sign-in.
 */
export async function signIn(email: string, password: string, client: string) {
  const wait = signInWaitMs(email, client);
  if (wait > 0) throw mustWait(wait, "errors.signInThrottled");
  const row = getDb().select().from(users).where(eq(users.email, email)).get();
  const ok = row?.passwordHash && !row.disabledAt ? await verifyPassword(row.passwordHash, password) : (await burnPasswordCheck(password), false);
  if (!row || !ok) {
    recordSignInFailure(email, client);
    throw new AppError("unauthenticated", "errors.badCredentials");
  }
  clearSignInFailures(email, client);
  const { token } = await openSession(row.id);
  recordAudit(getDb(), { userId: row.id, action: "user.signed-in", subject: row.id });
  // The person's language setting rides back so the sign-in can set the language cookie the API reads.
  return { user: toPublic(row), sessionToken: token, locale: row.locale };
}

/** A person's own language setting (null: follow the browser); only ever their own row. A setting, not a record: no audit line. */
export function setOwnLocale(actor: SessionUser, locale: Locale | null): void {
  getDb().update(users).set({ locale }).where(eq(users.id, actor.id)).run();
}

export async function signOut(sessionId: string, userId: string) {
  await lucia().invalidateSession(sessionId);
  recordAudit(getDb(), { userId, action: "user.signed-out", subject: userId });
}

export function listUsers() {
  return getDb()
    .select({ id: users.id, email: users.email, name: users.name, role: users.role, partyId: users.partyId, partyName: parties.name, partyKind: parties.kind, passwordHash: users.passwordHash, disabledAt: users.disabledAt, createdAt: users.createdAt })
    .from(users)
    .innerJoin(parties, eq(parties.id, users.partyId))
    .orderBy(asc(users.name))
    .all()
    .map(({ passwordHash, disabledAt, ...u }) => ({ ...u, status: disabledAt ? ("deactivated" as const) : passwordHash ? ("active" as const) : ("invited" as const) }));
}

/** Creates the user without a password and e-mails a single-use link to set one. */
export async function inviteUser(actor: SessionUser, input: InviteInput, origin: string, t: Translate) {
  if (!canManageUsers(actor)) throw forbidden();
  const db = getDb();
  const { token, hash } = newLinkToken();
  const id = generateIdFromEntropySize(10);
  db.transaction((tx) => {
    const party = tx.select().from(parties).where(eq(parties.id, input.partyId)).get();
    if (!party) throw invalid({ partyId: [t("validation.unknownParty")] });
    if (party.kind !== PARTY_KIND_FOR_ROLE[input.role]) {
      throw invalid({ role: [t("validation.roleNeedsParty", { kind: t(`parties.kinds.${PARTY_KIND_FOR_ROLE[input.role]}`) })] });
    }
    if (tx.select({ id: users.id }).from(users).where(eq(users.email, input.email)).get()) {
      throw new AppError("conflict", "errors.emailTaken", { email: [t("validation.emailTaken")] });
    }
    tx.insert(users).values({ id, email: input.email, name: input.name, role: input.role, partyId: input.partyId, createdAt: new Date() }).run();
    tx.insert(passwordTokens).values({ id: generateIdFromEntropySize(10), userId: id, tokenHash: hash, purpose: "invite", expiresAt: new Date(Date.now() + INVITE_TTL_MS), createdAt: new Date() }).run();
    recordAudit(tx, { userId: actor.id, action: "user.invited", subject: id, detail: { email: input.email, role: input.role } });
  });
  const link = `${origin}/set-password/${token}`;
  // The invited person has no language setting yet: the mail is in Japanese, the default (not the inviter's language).
  const mail = mailTranslator(null);
  await sendMail({
    to: input.email,
    subject: mail("mail.invite.subject"),
    text: mail("mail.invite.body", { name: input.name, inviter: actor.name, link, days: 7 }),
  });
  return { id };
}

/**
 * Always answers the same way, so the form does not reveal which addresses exist. Throttled per
 * address and per client on counters of their own: a reset request is not a failed sign-in.
 * A new link voids the person's older ones, so only the latest e-mail works.
 */
export async function requestPasswordReset(email: string, client: string, origin: string, t: Translate) {
  const wait = Math.max(attemptWaitMs("resetEmail", email), attemptWaitMs("resetClient", client));
  if (wait > 0) throw mustWait(wait);
  countAttempt("resetEmail", email);
  countAttempt("resetClient", client);
  const db = getDb();
  const row = db.select().from(users).where(eq(users.email, email)).get();
  if (!row || row.disabledAt) return;
  const { token, hash } = newLinkToken();
  db.transaction((tx) => {
    // Spent, not deleted: the row keeps when the link was sent; the audit log says why.
    tx.update(passwordTokens).set({ usedAt: new Date() }).where(and(eq(passwordTokens.userId, row.id), isNull(passwordTokens.usedAt))).run();
    tx.insert(passwordTokens).values({ id: generateIdFromEntropySize(10), userId: row.id, tokenHash: hash, purpose: "reset", expiresAt: new Date(Date.now() + RESET_TTL_MS), createdAt: new Date() }).run();
    recordAudit(tx, { userId: null, action: "user.reset-requested", subject: row.id });
  });
  const mail = mailTranslator(row.locale);
  await sendMail({ to: row.email, subject: mail("mail.reset.subject"), text: mail("mail.reset.body", { name: row.name, link: `${origin}/set-password/${token}`, minutes: 60 }) });
}

/** Who a still-valid link belongs to, for the set-password page; null if used or expired. */
export function findLinkHolder(token: string) {
  const row = getDb()
    .select({ name: users.name, email: users.email, purpose: passwordTokens.purpose })
    .from(passwordTokens)
    .innerJoin(users, eq(users.id, passwordTokens.userId))
    .where(and(eq(passwordTokens.tokenHash, hashLinkToken(token)), isNull(passwordTokens.usedAt), gt(passwordTokens.expiresAt, new Date())))
    .get();
  return row ?? null;
}

const liveLink = (tx: DbOrTx, token: string) =>
  tx
    .select()
    .from(passwordTokens)
    .where(and(eq(passwordTokens.tokenHash, hashLinkToken(token)), isNull(passwordTokens.usedAt), gt(passwordTokens.expiresAt, new Date())))
    .get();

/**
 * Uses a link once: sets the password and ends every session the person had. The link is
 * checked before the password is hashed, so a made-up link costs no argon2 work; links that
 * do not work are counted per client.
 */
export async function setPasswordWithToken(token: string, password: string, client: string, t: Translate) {
  const wait = attemptWaitMs("linkClient", client);
  if (wait > 0) throw mustWait(wait);
  const expired = () => invalid({ token: [t("validation.linkExpired")] }, "errors.linkExpired");
  const db = getDb();
  if (!liveLink(db, token)) {
    countAttempt("linkClient", client);
    throw expired();
  }
  const passwordHash = await hashPassword(password);
  const userId = db.transaction((tx) => {
    // Again inside the transaction: the link may have been used while the password was hashed.
    const row = liveLink(tx, token);
    if (!row) throw expired();
    tx.update(passwordTokens).set({ usedAt: new Date() }).where(eq(passwordTokens.id, row.id)).run();
    tx.update(users).set({ passwordHash }).where(eq(users.id, row.userId)).run();
    recordAudit(tx, { userId: row.userId, action: "user.password-set", subject: row.userId, detail: { via: row.purpose } });
    return row.userId;
  });
  await lucia().invalidateUserSessions(userId);
  const user = db.select().from(users).where(eq(users.id, userId)).get()!;
  return { email: user.email };
}

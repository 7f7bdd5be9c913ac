import { z } from "zod";
import { PARTY_KINDS, ROLES } from "@/domain/roles";
import { email } from "./auth";

const text = (max: number) => z.string().trim().max(max);
const checkbox = z
  .union([z.boolean(), z.literal("on"), z.literal("true"), z.literal("false"), z.literal("")])
  .optional()
  .transform((v) => v === true || v === "on" || v === "true");

export const partySchema = z.object({
  kind: z.enum(PARTY_KINDS),
  name: text(120).min(1),
  address: text(300).default(""),
  region: text(80).default(""),
  email: z.union([z.literal(""), email]).default(""),
  phone: text(40).default(""),
  namedPublicly: checkbox,
});
export type PartyInput = z.infer<typeof partySchema>;

export const inviteSchema = z.object({
  name: text(120).min(1),
  email,
  role: z.enum(ROLES),
  partyId: z.string().min(1).max(64),
});
export type InviteInput = z.infer<typeof inviteSchema>;

/** A user the admin acts on from the users table (deactivate, reactivate). */
export const userRefSchema = z.object({ userId: z.string().min(1).max(64) });
export const roleChangeSchema = userRefSchema.extend({ role: z.enum(ROLES) });

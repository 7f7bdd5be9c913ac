export const ROLES = ["admin", "brewer", "grower", "miller", "sales", "auditor"] as const;
export type Role = (typeof ROLES)[number];

export const PARTY_KINDS = ["brewery", "grower", "mill", "buyer"] as const;
export type PartyKind = (typeof PARTY_KINDS)[number];

/** The kind of party each role's users belong to. */
export const PARTY_KIND_FOR_ROLE: Record<Role, PartyKind> = {
  admin: "brewery",
  brewer: "brewery",
  sales: "brewery",
  auditor: "brewery",
  grower: "grower",
  miller: "mill",
};

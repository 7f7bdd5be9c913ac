import "server-only";
import { count } from "drizzle-orm";
import type { Db } from "@/db/client";
import { fields, parties, users } from "@/db/schema";
import type { PartyKind, Role } from "@/domain/roles";
import { hashPassword } from "../accounts/passwords";
import { seedBrewSeason } from "./seed-brewing";
import { seedSeason } from "./seed-season";
import { mailSeededStatements, seedSupplierAccounts, seedSupplierContracts } from "./seed-suppliers";
import type { SessionUser } from "../accounts/session";

/**
 * The invented demo scenario: Kirinoha Brewery in the (invented) Asagiri Valley, three
 * growers, one contract polishing mill and a wholesale buyer. Every name is made up;
 * the prefectures are real because rice-origin statements name prefectures.
 */
export const DEMO_PASSWORD = "grainline-demo";

type PartySeed = { id: string; kind: PartyKind; name: string; address: string; region: string; email: string; phone: string; namedPublicly: boolean };

const PARTIES: PartySeed[] = [
  { id: "brewery-kirinoha", kind: "brewery", name: "Kirinoha Brewery", address: "3-12 Kawazoe, Asagiri Valley", region: "Hyogo", email: "office@kirinoha.example", phone: "+81 790 00 0101", namedPublicly: true },
  { id: "grower-ikeda", kind: "grower", name: "Ikeda Farm", address: "Upper Terrace 8, Asagiri Valley", region: "Hyogo", email: "ikeda@farm.example", phone: "+81 790 00 0202", namedPublicly: true },
  { id: "grower-nakase", kind: "grower", name: "Nakase Family Paddies", address: "Riverside 21, Shimotsuki", region: "Hyogo", email: "nakase@paddies.example", phone: "+81 790 00 0303", namedPublicly: false },
  { id: "grower-coop", kind: "grower", name: "Upper Asagiri Growers' Cooperative", address: "Co-op Hall, Kamiasagiri", region: "Okayama", email: "coop@asagiri.example", phone: "+81 866 00 0404", namedPublicly: true },
  { id: "mill-shirotae", kind: "mill", name: "Shirotae Polishing Works", address: "Mill Road 5, Asagiri Valley", region: "Hyogo", email: "works@shirotae.example", phone: "+81 790 00 0505", namedPublicly: false },
  { id: "buyer-minato", kind: "buyer", name: "Minato Liquor Wholesale", address: "Harbour Street 40, Minato", region: "Osaka", email: "orders@minato.example", phone: "+81 6 0000 0606", namedPublicly: false },
];

export const DEMO_USERS: { id: string; email: string; name: string; role: Role; partyId: string }[] = [
  { id: "user-admin", email: "admin@example.com", name: "Mori Sachiko", role: "admin", partyId: "brewery-kirinoha" },
  { id: "user-brewer", email: "brewer@example.com", name: "Fujita Ren", role: "brewer", partyId: "brewery-kirinoha" },
  { id: "user-grower", email: "grower@example.com", name: "Ikeda Haruto", role: "grower", partyId: "grower-ikeda" },
  { id: "user-grower2", email: "grower2@example.com", name: "Nakase Emi", role: "grower", partyId: "grower-nakase" },
  { id: "user-miller", email: "miller@example.com", name: "Ota Kenji", role: "miller", partyId: "mill-shirotae" },
  { id: "user-sales", email: "sales@example.com", name: "Hayashi Aoi", role: "sales", partyId: "brewery-kirinoha" },
  { id: "user-auditor", email: "auditor@example.com", name: "Kubo Daisuke", role: "auditor", partyId: "brewery-kirinoha" },
];

const FIELDS = [
  { id: "field-ikeda-terrace", growerId: "grower-ikeda", name: "Terrace Paddy", region: "Hyogo", areaHa: 1.2, latitude: 35.01, longitude: 134.62 },
  { id: "field-ikeda-cedar", growerId: "grower-ikeda", name: "Cedar Bend", region: "Hyogo", areaHa: 0.8, latitude: 35.02, longitude: 134.63 },
  { id: "field-nakase-river", growerId: "grower-nakase", name: "River Flat", region: "Hyogo", areaHa: 2.1, latitude: 34.98, longitude: 134.6 },
  { id: "field-nakase-shrine", growerId: "grower-nakase", name: "Shrine Field", region: "Hyogo", areaHa: 0.9, latitude: 34.99, longitude: 134.61 },
  { id: "field-coop-north", growerId: "grower-coop", name: "North Basin", region: "Okayama", areaHa: 3.4, latitude: 34.88, longitude: 133.72 },
  { id: "field-coop-stone", growerId: "grower-coop", name: "Stone Wall Plots", region: "Okayama", areaHa: 1.6, latitude: 34.89, longitude: 133.73 },
];

/** Seeds only an empty database; returns false when there was already someone in it. */
export async function seedDemo(db: Db): Promise<boolean> {
  if (db.select({ n: count() }).from(users).get()!.n > 0) return false;
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const now = new Date();
  const statements = db.transaction((tx) => {
    tx.insert(parties).values(PARTIES.map((p) => ({ ...p, createdAt: now }))).run();
    tx.insert(users).values(DEMO_USERS.map((u) => ({ ...u, passwordHash, createdAt: now }))).run();
    tx.insert(fields).values(FIELDS.map((f) => ({ ...f, createdAt: now }))).run();
    const actor = (id: string): SessionUser => DEMO_USERS.find((u) => u.id === id)!;
    const people = { admin: actor("user-admin"), grower: actor("user-grower"), grower2: actor("user-grower2"), miller: actor("user-miller"), brewer: actor("user-brewer") };
    seedSupplierContracts(tx, people.admin);
    seedBrewSeason(tx, people);
    seedSeason(tx, { admin: actor("user-admin"), grower: actor("user-grower"), grower2: actor("user-grower2"), miller: actor("user-miller"), brewer: actor("user-brewer") });
    return seedSupplierAccounts(tx, people.admin);
  });
  await mailSeededStatements(db, statements);
  return true;
}

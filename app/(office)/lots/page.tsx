import { getTranslations } from "next-intl/server";
import { z } from "zod";
import { optionalTypedNumber } from "@/lib/validation/typed";
import { GRADES } from "@/domain/grades";
import { LOT_KIND_LIST } from "@/domain/steps";
import { LOT_SORTS, listLots } from "@/server/ledger/lots";
import { requirePageUser } from "@/server/accounts/page-guard";
import { listParties } from "@/server/ledger/parties";
import { can } from "@/domain/permissions";
import { LedgerLotsTable } from "./components";
import { PageHeader } from "@/components/page-header";
import { withClientMessages } from "@/i18n/client-messages";

export async function generateMetadata() {
  return { title: (await getTranslations("lotsPage"))("title") };
}

const PAGE_SIZE = 25;
const blank = (v: unknown) => (v === "" ? undefined : v);
const searchSchema = z.object({
  kind: z.preprocess(blank, z.enum(LOT_KIND_LIST).optional()).catch(undefined),
  grade: z.preprocess(blank, z.enum(GRADES).optional()).catch(undefined),
  variety: z.preprocess(blank, z.string().max(60).optional()).catch(undefined),
  cropYear: optionalTypedNumber(2000, 2100, { int: true }).catch(undefined),
  q: z.preprocess(blank, z.string().max(20).optional()).catch(undefined),
  partyId: z.preprocess(blank, z.string().max(64).optional()).catch(undefined),
  sort: z.enum(LOT_SORTS).optional().catch(undefined),
  dir: z.enum(["asc", "desc"]).optional().catch(undefined),
  page: z.coerce.number().int().min(1).max(100_000).default(1).catch(1),
});

async function LotsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageUser();
  const t = await getTranslations("lotsPage");
  const query = searchSchema.parse(await searchParams);
  const { items, total } = listLots(user, { ...query, limit: PAGE_SIZE, offset: (query.page - 1) * PAGE_SIZE });
  return (
    <div className="space-y-6">
      <PageHeader title={t("title")} intro={t("intro")} />
      <LedgerLotsTable
        rows={items}
        total={total}
        pageSize={PAGE_SIZE}
        query={{ ...query, cropYear: query.cropYear?.toString() }}
        holders={can(user, "records:read-all") ? listParties().filter((p) => p.kind !== "buyer").map(({ id, name }) => [id, name]) : []}
      />
    </div>
  );
}

export default withClientMessages(["floorScan", "lot", "lotsPage", "table"], LotsPage);

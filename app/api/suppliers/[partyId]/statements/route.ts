import { z } from "zod";
import { handle, readJson, requireApiPermission, requireApiUser } from "@/server/platform/http";
import { publicOrigin } from "@/server/platform/public-origin";
import { mailStatement, statementPdfPath } from "@/server/suppliers/supplier-statement-mail";
import { issueStatement, listStatements, statementByNumber } from "@/server/suppliers/supplier-statements";
import { getDb } from "@/server/platform/db";
import { requireReadableSupplier } from "@/server/suppliers/supplier-ledger";

export const GET = handle(async (request, { params }) => {
  const actor = await requireApiUser(request);
  const partyId = params.partyId ?? "";
  requireReadableSupplier(getDb(), actor, partyId);
  const items = listStatements(partyId).map(({ totals: _totals, ...s }) => ({ ...s, pdf: statementPdfPath(partyId, s.number) }));
  return Response.json({ items });
});

/** `{ from, to, email? }` → 201 `{ number, totals, balanceYen, mailed }`: issues (and e-mails) a statement. */
export const POST = handle(async (request, { params, t }) => {
  const actor = await requireApiPermission(request, "ledger:manage");
  const partyId = params.partyId ?? "";
  const body = await readJson(request, z.unknown(), t);
  const issued = issueStatement(actor, partyId, body, t);
  const mailed = issued.email ? await mailStatement(statementByNumber(getDb(), issued.number), publicOrigin()) : null;
  return Response.json({ number: issued.number, totals: issued.totals, balanceYen: issued.balanceYen, mailed, pdf: statementPdfPath(partyId, issued.number) }, { status: 201 });
});

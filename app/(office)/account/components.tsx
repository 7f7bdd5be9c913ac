"use client";

import Link from "@/components/app-link";
import { useFormatter, useTranslations } from "next-intl";
import { useQuantity } from "@/lib/use-quantity";
import type { ColumnDef } from "@tanstack/react-table";
import { DataTable } from "@/components/data-table";
import type { HarvestTrail } from "@/server/suppliers/supplier-portal";

type FieldRow = { id: string; name: string; region: string; areaHa: number };

export function MyFields({ rows }: { rows: FieldRow[] }) {
  const t = useTranslations("suppliers.portal");
  const format = useFormatter();
  const columns: ColumnDef<FieldRow, any>[] = [
    { accessorKey: "name", header: t("name") },
    { accessorKey: "region", header: t("region") },
    { accessorKey: "areaHa", header: t("area"), cell: (c) => format.number(c.getValue(), { minimumFractionDigits: 2, maximumFractionDigits: 2 }) },
  ];
  return <DataTable data={rows} columns={columns} label={t("fields")} testId="my-fields" exportName="grainline-fields" />;
}

/** Each harvest lot with the tanks and bottlings it reached and the share of each that is this rice. */
export function HarvestTrails({ rows }: { rows: HarvestTrail[] }) {
  const t = useTranslations("suppliers.portal");
  const tl = useTranslations("lot");
  const format = useFormatter();
  const amount = useQuantity();
  const pct = (v: number) => format.number(v, { style: "percent", maximumFractionDigits: 1 });
  return (
    <ul className="grid gap-3 md:grid-cols-2" data-testid="harvest-trails">
      {rows.map((h) => (
        <li key={h.code} className="panel space-y-2" data-testid={`trail-${h.code}`}>
          <p className="flex flex-wrap items-center gap-2">
            <Link className="code-chip no-underline" href={`/lots/${h.code}`}>{h.code}</Link>
            <span className="font-semibold">{h.variety} {h.cropYear}</span>
            {h.grade ? <span className="text-sm text-ink-soft">{tl(`grades.${h.grade}`)}</span> : null}
            <span className="text-sm text-ink-soft">{amount(h.kg, "kg")}{h.field ? ` · ${h.field}` : ""}</span>
          </p>
          {h.destinations.length ? (
            <ul className="space-y-1 text-sm">
              {h.destinations.map((d) => (
                <li key={d.code} className="flex flex-wrap items-baseline gap-2">
                  <span className="rounded bg-koji-pale px-2 text-xs font-semibold">{t(`destinationKinds.${d.kind}`)}</span>
                  <span className="code-chip">{d.code}</span>
                  {d.name ? <span>{d.name}</span> : null}
                  <span className="text-ink-soft">{format.dateTime(d.at, "day")}</span>
                  <strong>{t("share", { share: pct(d.fraction), code: d.code })}</strong>
                </li>
              ))}
            </ul>
          ) : (
            <p className="text-sm text-ink-soft">{t("notYet")}</p>
          )}
        </li>
      ))}
    </ul>
  );
}

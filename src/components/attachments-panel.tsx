"use client";

import { useState, type FormEvent, type InputHTMLAttributes } from "react";
import { useRouter } from "next/navigation";
import { useFormatter, useTranslations } from "next-intl";
import { ACCEPT_ATTRIBUTE, MAX_ATTACHMENT_BYTES, MAX_TITLE_LENGTH, readableSize } from "@/domain/file-kinds";
import type { FormState } from "@/lib/form-state";
import type { AttachmentItem } from "@/server/records/attachments";
import { FormMessage } from "./ui/form-message";

export type { AttachmentItem };

const MEGABYTES = MAX_ATTACHMENT_BYTES / (1024 * 1024);

/** A lot's certificates and reports, with an upload form for those who may add one. */
export function AttachmentsPanel({ code, canUpload, items }: { code: string; canUpload: boolean; items: AttachmentItem[] }) {
  const t = useTranslations("attachments");
  const format = useFormatter();
  const size = (bytes: number) => {
    const { value, unit } = readableSize(bytes);
    return t(`size.${unit}`, { value: format.number(value, { maximumFractionDigits: 1 }) });
  };
  return (
    <section className="panel space-y-4" data-testid="attachments-panel" aria-labelledby="attachments-heading">
      <header>
        <h2 id="attachments-heading" className="text-xl font-bold">{t("heading")}</h2>
        <p className="text-ink-soft">{t("intro")}</p>
      </header>
      {items.length === 0 ? (
        <p className="text-ink-soft">{t("empty")}</p>
      ) : (
        <div className="overflow-x-auto">
          <table className="w-full text-left text-sm" data-testid="attachments-table">
            <thead className="border-b-2 border-husk">
              <tr>
                {["titleColumn", "fileColumn", "typeColumn", "sizeColumn", "byColumn", "atColumn"].map((k) => (
                  <th key={k} scope="col" className="py-2 pr-4 font-semibold">{t(k)}</th>
                ))}
                <th scope="col" className="py-2"><span className="sr-only">{t("download")}</span></th>
              </tr>
            </thead>
            <tbody>
              {items.map((a) => (
                <tr key={a.id} className="border-b border-paper-deep align-top">
                  <td className="py-2 pr-4">
                    {a.title || "—"}
                    {a.eventId ? <span className="block text-ink-soft">{t("forEvent", { id: a.eventId })}</span> : null}
                  </td>
                  <td className="py-2 pr-4 break-all">{a.fileName}</td>
                  <td className="py-2 pr-4">{t(`types.${a.kind ?? "other"}`)}</td>
                  <td className="py-2 pr-4 whitespace-nowrap">{size(a.size)}</td>
                  <td className="py-2 pr-4">{a.userName}</td>
                  <td className="py-2 pr-4 whitespace-nowrap">{format.dateTime(new Date(a.createdAt), "dayTime")}</td>
                  <td className="py-2">
                    <a href={a.href} download={a.fileName} className="font-semibold text-cedar underline" aria-label={t("downloadFile", { name: a.fileName })}>
                      {t("download")}
                    </a>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {canUpload ? <UploadForm code={code} /> : null}
    </section>
  );
}

function UploadForm({ code }: { code: string }) {
  const t = useTranslations("attachments");
  const router = useRouter();
  const [state, setState] = useState<FormState>({});
  const [pending, setPending] = useState(false);

  async function upload(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = event.currentTarget;
    const data = new FormData(form);
    const file = data.get("file");
    const name = file instanceof File ? file.name : "";
    // Spare the upload when the browser already knows the file is too big; the server checks anyway.
    if (file instanceof File && file.size > MAX_ATTACHMENT_BYTES) {
      setState({ message: t("failed"), fields: { file: [t("tooLarge", { megabytes: MEGABYTES })] } });
      return;
    }
    setPending(true);
    try {
      const response = await fetch(`/api/lots/${encodeURIComponent(code)}/attachments`, { method: "POST", body: data });
      const body = (await response.json().catch(() => null)) as { error?: { message?: string; fields?: Record<string, string[]> } } | null;
      if (response.status === 201) {
        form.reset();
        setState({ ok: true, message: t("uploaded", { name }) });
        router.refresh();
      } else if (response.status === 413) {
        setState({ message: t("failed"), fields: { file: [body?.error?.message ?? t("tooLarge", { megabytes: MEGABYTES })] } });
      } else {
        setState({ message: body?.error?.message ?? t("failed"), fields: body?.error?.fields });
      }
    } catch {
      setState({ message: t("failed") });
    } finally {
      setPending(false);
    }
  }

  return (
    <form onSubmit={upload} className="grid gap-4 border-t-2 border-paper-deep pt-4 sm:grid-cols-2" noValidate aria-busy={pending}>
      <h3 className="text-lg font-bold sm:col-span-2">{t("uploadHeading")}</h3>
      <div className="sm:col-span-2">
        <FormMessage state={state} />
      </div>
      <Field id="attachment-file" name="file" type="file" accept={ACCEPT_ATTRIBUTE} required label={t("file", { megabytes: MEGABYTES })} errors={state.fields?.file} />
      <Field id="attachment-title" name="title" maxLength={MAX_TITLE_LENGTH} placeholder={t("titlePlaceholder")} label={t("title")} errors={state.fields?.title} />
      {state.fields?.eventId ? <p className="field-error sm:col-span-2">{state.fields.eventId.join(" ")}</p> : null}
      <div className="sm:col-span-2">
        <button type="submit" className="btn" disabled={pending}>{pending ? t("uploading") : t("upload")}</button>
      </div>
    </form>
  );
}

/** Like ui/form-field, with ids of its own: the lot page holds other forms with a "title". */
function Field({ id, label, errors, ...input }: InputHTMLAttributes<HTMLInputElement> & { id: string; label: string; errors?: string[] }) {
  const invalid = Boolean(errors?.length);
  return (
    <div>
      <label htmlFor={id} className="field-label">{label}</label>
      <input id={id} className="field-input" aria-invalid={invalid || undefined} aria-describedby={invalid ? `${id}-error` : undefined} {...input} />
      {invalid ? <p id={`${id}-error`} className="field-error">{errors!.join(" ")}</p> : null}
    </div>
  );
}

import "server-only";
import { getTranslations } from "next-intl/server";
import { headers } from "next/headers";
import { unstable_rethrow } from "next/navigation";
import { z } from "zod";
import type { FormState } from "@/lib/form-state";
import { fieldErrorsFrom, type Translate } from "@/lib/validation/field-errors";
import { AppError } from "./errors";
import { clientAddress } from "./client-address";
import { publicOrigin } from "./public-origin";

export async function actionTranslator(): Promise<Translate> {
  const t = await getTranslations();
  return (key, values) => t(key as never, values as never);
}

/**
 * Runs a server action's body and turns what it throws into form state: field errors
 * beside their fields, one message on top. Redirects pass through.
 */
export async function guardAction(
  values: Record<string, string>,
  body: (t: Translate) => Promise<FormState | void>,
): Promise<FormState> {
  const t = await actionTranslator();
  try {
    return (await body(t)) ?? { ok: true };
  } catch (error) {
    unstable_rethrow(error);
    if (error instanceof z.ZodError) return { message: t("errors.invalid"), fields: fieldErrorsFrom(error, t), values };
    // A wait is worth saying in full ("wait 4 seconds"); other refusals keep their short form.
    if (error instanceof AppError) return { message: error.code === "rate_limited" ? error.say(t) : t(`errors.${error.code}`), fields: error.fields, values };
    console.error(error);
    return { message: t("errors.internal"), values };
  }
}

/** The origin links in e-mails point at: the configured one, never the request's Host (src/server/platform/public-origin.ts). */
export async function actionOrigin(): Promise<string> {
  return publicOrigin();
}

export async function actionClientKey(): Promise<string> {
  const h = await headers();
  return clientAddress(h);
}

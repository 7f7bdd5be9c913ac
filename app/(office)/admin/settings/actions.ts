"use server";

import { revalidatePath } from "next/cache";
import { formValues, type FormState } from "@/lib/form-state";
import { settingsFromForm } from "@/lib/validation/settings";
import { guardAction } from "@/server/platform/action";
import { requireUser } from "@/server/accounts/session";
import { restoreSettingDefaults, saveSettings } from "@/server/platform/settings";
import { saveTank } from "@/server/floor/tank-register";
import { addVariety, removeVariety } from "@/server/floor/variety-list";

export async function saveSettingsAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    // saveSettings checks settings:manage itself, so the API and this form refuse alike.
    const { changed } = saveSettings(await requireUser(), settingsFromForm(values), t);
    revalidatePath("/admin/settings");
    return { ok: true, message: t(changed.length ? "settingsPage.saved" : "settingsPage.unchanged") };
  });
}

export async function restoreDefaultsAction(_prev: FormState, formData: FormData): Promise<FormState> {
  return guardAction(formValues(formData), async (t) => {
    const { changed } = restoreSettingDefaults(await requireUser());
    revalidatePath("/admin/settings");
    return { ok: true, message: t(changed.length ? "settingsPage.restored" : "settingsPage.alreadyDefaults") };
  });
}

export async function saveTankAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    // saveTank checks settings:manage itself; the audit entry is written with the change.
    saveTank(await requireUser(), values, t);
    revalidatePath("/admin/settings");
    return { ok: true, message: t("tankRegister.saved", { name: values.name?.trim() ?? "" }) };
  });
}

export async function addVarietyAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const { name } = addVariety(await requireUser(), values, t);
    revalidatePath("/admin/settings");
    return { ok: true, message: t("varietyList.added", { name }) };
  });
}

export async function removeVarietyAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formValues(formData);
  return guardAction(values, async (t) => {
    const { name } = removeVariety(await requireUser(), values, t);
    revalidatePath("/admin/settings");
    return { ok: true, message: t("varietyList.removed", { name }) };
  });
}

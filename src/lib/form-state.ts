/** What a server action hands back to its form. */
export type FormState = {
  ok?: boolean;
  message?: string;
  fields?: Record<string, string[]>;
  values?: Record<string, string>;
};

export const initialFormState: FormState = {};

export function formValues(formData: FormData): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [key, value] of formData.entries()) {
    if (typeof value === "string" && !key.startsWith("$")) out[key] = value;
  }
  return out;
}

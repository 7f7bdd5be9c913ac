import type { FormState } from "@/lib/form-state";

/** The one-line outcome of a form, announced to screen readers. */
export function FormMessage({ state }: { state: FormState }) {
  if (!state.message) return null;
  return (
    <p data-testid="form-message" role={state.ok ? "status" : "alert"} className={state.ok ? "notice" : "notice-warn font-semibold"}>
      {state.message}
    </p>
  );
}

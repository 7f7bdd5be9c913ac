"use client";

import { useTranslations } from "next-intl";
import { useState } from "react";
import { lotCodeFromScan } from "@/lib/scan-text";
import { Scanner } from "./scanner";

type Props = {
  id: string;
  name?: string;
  label: string;
  value: string;
  onChange: (value: string) => void;
  /** Several bags for one field: a scan while this field holds a code goes to `onAppend`. */
  onAppend?: (code: string) => void;
  /** Codes already on the form for this field; scanning one again is refused with a message. */
  taken?: readonly string[];
  required?: boolean;
  errors?: readonly string[];
  /** The floor's large dark screens, or an office form's ordinary field. */
  variant?: "floor" | "office";
};

const LOOK = {
  floor: { label: "block text-lg font-semibold", input: "field-input min-h-14 text-2xl", button: "btn-quiet min-h-14 shrink-0 px-4", error: "notice-warn mt-1 text-base text-ink" },
  office: { label: "field-label", input: "field-input", button: "btn-quiet shrink-0", error: "field-error" },
};

/**
 * A lot-code input with a scan button: the camera opens under the field and the label's
 * code fills it (or, for several bags, is appended as another row). A code scanned twice
 * for the same field is refused, since the same bag drawn twice would double its weight.
 */
export function CodeField({ id, name, label, value, onChange, onAppend, taken = [], required, errors, variant = "floor" }: Props) {
  const look = LOOK[variant];
  const t = useTranslations("floorScan.codeField");
  const [scanning, setScanning] = useState(false);
  const [notice, setNotice] = useState<string | null>(null);

  const read = (text: string): boolean => {
    const code = lotCodeFromScan(text);
    if (!code) {
      setNotice(t("notOurs"));
      return false;
    }
    if (taken.includes(code) || code === value.trim().toUpperCase()) {
      // Keep looking: the camera is still on the bag just scanned.
      setNotice(t("duplicate", { code }));
      return false;
    }
    navigator.vibrate?.(60);
    setNotice(null);
    if (onAppend && value.trim() !== "") onAppend(code);
    else onChange(code);
    setScanning(false);
    return true;
  };

  const described = [errors?.length ? `${id}-error` : "", notice ? `${id}-notice` : ""].filter(Boolean).join(" ") || undefined;
  return (
    <div data-testid={`code-field-${id}`}>
      <div className="flex items-baseline">
        <label htmlFor={id} className={look.label}>{label}</label>
        {required ? <RequiredMark /> : null}
      </div>
      <div className="flex gap-2">
        <input
          id={id}
          name={name}
          className={`${look.input} font-[family-name:var(--font-code)] uppercase placeholder:normal-case`}
          autoCapitalize="characters"
          autoComplete="off"
          spellCheck={false}
          maxLength={200}
          aria-required={required || undefined}
          aria-invalid={errors?.length ? true : undefined}
          aria-describedby={described}
          value={value}
          onChange={(e) => onChange(e.target.value)}
        />
        <button type="button" className={look.button} aria-expanded={scanning} aria-controls={`${id}-scanner`} onClick={() => (setScanning((s) => !s), setNotice(null))}>
          {scanning ? t("close") : t("scan")}
          <span className="sr-only"> {label}</span>
        </button>
      </div>
      {errors?.length ? <p id={`${id}-error`} className={look.error} data-testid={`${id}-error`}>{errors.join(" ")}</p> : null}
      {notice ? <p id={`${id}-notice`} role="alert" className="notice-warn mt-2 text-ink" data-testid={`${id}-notice`}>{notice}</p> : null}
      {scanning ? (
        <div id={`${id}-scanner`} className="mt-3">
          <Scanner onText={read} autoStart />
        </div>
      ) : null}
    </div>
  );
}

/**
 * The visible mark of a required field, beside its label rather than in it, so the field's
 * name stays the label's words; screen readers get aria-required instead.
 */
export function RequiredMark() {
  const t = useTranslations("floorScan.codeField");
  return (
    <span className="ml-1 text-persimmon" aria-hidden="true" title={t("required")}>
      *
    </span>
  );
}

/** For an office form posted as it is (a server action or a GET search): the field keeps its own value. */
export function ScanCodeInput({ defaultValue = "", ...props }: Omit<Props, "value" | "onChange" | "variant"> & { defaultValue?: string }) {
  const [value, setValue] = useState(defaultValue);
  return <CodeField {...props} variant="office" value={value} onChange={setValue} />;
}

import type { InputHTMLAttributes } from "react";

type Props = InputHTMLAttributes<HTMLInputElement> & { label: string; name: string; errors?: string[] };

/** A labelled input with its errors beside it, tied together for screen readers. */
export function FormField({ label, name, errors, ...input }: Props) {
  const errorId = `${name}-error`;
  return (
    <div>
      <label htmlFor={name} className="field-label">
        {label}
      </label>
      <input
        id={name}
        name={name}
        className="field-input"
        aria-invalid={errors?.length ? true : undefined}
        aria-describedby={errors?.length ? errorId : undefined}
        {...input}
      />
      {errors?.length ? (
        <p id={errorId} className="field-error">
          {errors.join(" ")}
        </p>
      ) : null}
    </div>
  );
}

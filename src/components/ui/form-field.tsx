import type { InputHTMLAttributes } from "react";

type Props = InputHTMLAttributes<HTMLInputElement> & { label: string; name: string; errors?: string[] };

/** A labelled input with its errors beside it, tied together for screen readers. */
export function FormField({ label, name, errors, id = name, ...input }: Props) {
  // Two forms on one page may share a field name: an id of their own keeps each label to its input.
  const errorId = `${id}-error`;
  return (
    <div>
      <label htmlFor={id} className="field-label">
        {label}
      </label>
      <input
        id={id}
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

"use client";

import type { SelectHTMLAttributes } from "react";

/** A labelled drop-down in the same size and colours as TextField. */
export function SelectField({
  label,
  id,
  options,
  error,
  ...props
}: SelectHTMLAttributes<HTMLSelectElement> & { label: string; id: string; options: { value: string; label: string }[]; error?: string }) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-bold">
        {label}
      </label>
      <select
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : undefined}
        className={`tap rounded-xl border bg-white px-3 py-2 text-base ${error ? "border-clay-500" : "border-river-300"}`}
        {...props}
      >
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
      {error && (
        <p id={`${id}-error`} className="text-sm font-bold text-clay-700">
          {error}
        </p>
      )}
    </div>
  );
}

/** A number typed into a text box: undefined when empty, NaN when not a number. */
export function numberOrUndefined(text: string): number | undefined {
  const t = text.trim().replace(",", ".");
  return t === "" ? undefined : Number(t);
}

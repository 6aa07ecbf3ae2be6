"use client";

/** A group of large radio buttons: easier to hit with a thumb in a ute than a drop-down. */
export function ChoiceButtons<T extends string>({
  legend,
  name,
  options,
  value,
  onChange,
}: {
  legend: string;
  name: string;
  options: { value: T; label: string; hint?: string }[];
  value: T | "";
  onChange: (value: T) => void;
}) {
  return (
    <fieldset className="flex flex-col gap-1">
      <legend className="mb-1 text-sm font-bold">{legend}</legend>
      <div className="grid grid-cols-2 gap-2 sm:grid-cols-3">
        {options.map((o) => (
          <label
            key={o.value}
            className={`tap flex cursor-pointer flex-col justify-center rounded-xl px-3 py-2 ring-2 has-[:focus-visible]:outline has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-river-700 ${
              value === o.value ? "bg-river-700 text-white ring-river-700" : "bg-white text-ink ring-river-300"
            }`}
          >
            <input type="radio" name={name} value={o.value} checked={value === o.value} onChange={() => onChange(o.value)} className="sr-only" />
            <span className="font-bold">{o.label}</span>
            {o.hint && <span className={`text-sm ${value === o.value ? "text-white/90" : "text-ink/70"}`}>{o.hint}</span>}
          </label>
        ))}
      </div>
    </fieldset>
  );
}

import type { ButtonHTMLAttributes } from "react";

type Variant = "primary" | "secondary" | "quiet" | "danger";

const VARIANTS: Record<Variant, string> = {
  primary: "bg-river-700 text-white hover:bg-river-900 disabled:bg-river-300",
  secondary: "bg-white text-river-900 ring-1 ring-river-300 hover:bg-river-50",
  quiet: "text-river-700 hover:bg-river-50",
  danger: "bg-white text-clay-700 ring-1 ring-clay-300 hover:bg-clay-50",
};

export function Button({
  variant = "primary",
  className = "",
  ...props
}: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return (
    <button
      className={`tap inline-flex items-center justify-center gap-2 rounded-xl px-4 py-2 text-base font-bold transition-colors disabled:cursor-not-allowed ${VARIANTS[variant]} ${className}`}
      {...props}
    />
  );
}

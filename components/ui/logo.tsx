/** Rootbank's mark: a water drop held in three bands of soil, with a root drawing from it. */
export function Logo({ className = "h-8 w-8" }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true">
      <rect width="32" height="32" rx="8" fill="#1d5566" />
      <path d="M4 17h24M4 22h24M4 27h24" stroke="#d8c48f" strokeWidth="1.6" strokeLinecap="round" opacity="0.8" />
      <path d="M16 4c-3.2 4.2-5 7-5 9.2a5 5 0 0 0 10 0C21 11 19.2 8.2 16 4Z" fill="#eef6f8" />
      <path d="M16 18v10M16 23l-3.5 3M16 21l3 2.5" stroke="#eef6f8" strokeWidth="1.5" strokeLinecap="round" />
    </svg>
  );
}

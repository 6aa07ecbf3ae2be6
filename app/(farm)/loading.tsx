export default function Loading() {
  return <p className="p-6 text-ink/70">Loading the farm…</p>;
}

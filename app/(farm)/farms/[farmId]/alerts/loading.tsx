export default function Loading() {
  return <p className="text-ink/70">Loading alerts…</p>;
}

export default function Loading() {
  return <p className="text-ink/70">Opening the crop settings…</p>;
}

export default function Loading() {
  return <p className="text-ink/75">Adding up the season…</p>;
}

export default function Loading() {
  return <p className="text-ink/75">Opening the field…</p>;
}

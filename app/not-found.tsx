import Link from "next/link";

export default function NotFound() {
  return (
    <main className="mx-auto flex max-w-md flex-col gap-3 px-5 py-16">
      <h1 className="text-2xl font-bold">Nothing here</h1>
      <p>This page does not exist, or it belongs to a farm you are not a member of.</p>
      <Link href="/" className="text-river-700 underline">
        Back to your farm
      </Link>
    </main>
  );
}

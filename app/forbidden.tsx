import Link from "next/link";

export default function Forbidden() {
  return (
    <main className="mx-auto flex max-w-md flex-col gap-3 px-5 py-16">
      <h1 className="text-2xl font-bold">Not open to your role</h1>
      <p>Your role on this farm does not include this page. Ask the farm&apos;s owner or manager if you need it.</p>
      <Link href="/" className="text-river-700 underline">
        Back to your farm
      </Link>
    </main>
  );
}

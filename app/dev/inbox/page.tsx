import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { env } from "@/lib/env";
import { Logo } from "@/components/ui/logo";

export const metadata: Metadata = { title: "Local inbox" };
export const dynamic = "force-dynamic";

interface Message {
  id: string;
  from: string;
  to: string[];
  subject: string;
  date: string;
  text: string;
}

/** The captured e-mail of the local inbox. It exists only while Rootbank sends mail to that inbox. */
export default async function InboxPage() {
  const inboxUrl = env().LOCAL_INBOX_URL;
  if (!inboxUrl) notFound();
  let messages: Message[] = [];
  let problem: string | null = null;
  try {
    const res = await fetch(`${inboxUrl}/messages`, { cache: "no-store" });
    messages = (await res.json()) as Message[];
  } catch {
    problem = "The local inbox is not running. `npm start` starts it.";
  }
  const linkify = (text: string) =>
    text.split(/(https?:\/\/\S+)/).map((part, i) =>
      /^https?:\/\//.test(part) ? (
        <a key={i} href={part} className="break-all text-river-700 underline">
          {part}
        </a>
      ) : (
        part
      ),
    );
  return (
    <main className="mx-auto flex max-w-3xl flex-col gap-4 px-5 py-8">
      <div className="flex items-center gap-3">
        <Logo />
        <h1 className="text-2xl font-bold">Local inbox</h1>
      </div>
      <p className="text-ink/80">E-mail that Rootbank sent while it runs with the local inbox. Newest first.</p>
      {problem && <p className="font-bold text-clay-700">{problem}</p>}
      {messages.length === 0 && !problem && <p>No e-mail yet.</p>}
      <ul className="flex flex-col gap-3">
        {messages.map((m) => (
          <li key={m.id} className="rounded-2xl bg-white p-4 ring-1 ring-river-100">
            <p className="font-bold">{m.subject}</p>
            <p className="text-sm text-ink/70">
              to {m.to.join(", ")} · {new Date(m.date).toLocaleString("en-GB")}
            </p>
            <pre className="mt-2 whitespace-pre-wrap font-sans text-sm">{linkify(m.text)}</pre>
          </li>
        ))}
      </ul>
    </main>
  );
}

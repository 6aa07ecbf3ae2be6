import type { Metadata } from "next";
import Link from "next/link";
import { Logo } from "@/components/ui/logo";
import { OperationCard } from "@/components/reference/operation-card";
import { OPERATIONS } from "@/lib/openapi/document";

export const metadata: Metadata = { title: "API reference" };

/** The REST API described for people, from the same document as /api/v1/openapi.json. */
export default function ReferencePage() {
  const tags = [...new Set(OPERATIONS.map((op) => op.tag))];
  return (
    <main className="mx-auto flex max-w-4xl flex-col gap-6 px-5 py-8">
      <div className="flex items-center gap-3">
        <Logo />
        <h1 className="text-2xl font-bold">Rootbank API reference</h1>
      </div>
      <div className="flex flex-col gap-2 text-ink/85">
        <p>
          Everything the app shows is read through this API, and integrations use the same one. Requests and answers are JSON;
          units are in the field names (<code className="font-mono">depthMm</code>, <code className="font-mono">windMs</code>); dates are the
          farm&apos;s local dates (<code className="font-mono">2026-11-30</code>) and instants are ISO 8601 with a time zone.
        </p>
        <p>
          Sign in for a session cookie, or send a logger token as <code className="font-mono">Authorization: Bearer rbk_…</code> where an
          operation allows it. Every error has the shape <code className="font-mono">{"{ error: { code, message, fields? } }"}</code>. Creates
          accept your own <code className="font-mono">id</code> (a UUID): sending it again returns the stored record instead of a copy.
        </p>
        <p>
          Machine-readable: <Link className="text-river-700 underline" href="/api/v1/openapi.json">/api/v1/openapi.json</Link> (OpenAPI 3.1).
        </p>
      </div>
      <nav aria-label="API sections" className="flex flex-wrap gap-2">
        {tags.map((tag) => (
          <a key={tag} href={`#${tag.toLowerCase()}`} className="tap flex items-center rounded-lg bg-white px-3 font-bold text-river-700 ring-1 ring-river-100">
            {tag}
          </a>
        ))}
      </nav>
      {tags.map((tag) => (
        <section key={tag} id={tag.toLowerCase()} aria-labelledby={`${tag}-heading`} className="flex flex-col gap-3">
          <h2 id={`${tag}-heading`} className="text-xl font-bold">
            {tag}
          </h2>
          {OPERATIONS.filter((op) => op.tag === tag).map((op) => (
            <OperationCard key={`${op.method} ${op.path}`} op={op} />
          ))}
        </section>
      ))}
    </main>
  );
}

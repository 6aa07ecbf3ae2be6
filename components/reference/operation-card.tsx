import { z } from "zod";
import type { Operation } from "@/lib/openapi/types";

const METHOD_STYLE: Record<Operation["method"], string> = {
  get: "bg-river-100 text-river-900",
  post: "bg-reed-100 text-reed-700",
  put: "bg-clay-100 text-clay-900",
  patch: "bg-clay-100 text-clay-900",
  delete: "bg-clay-50 text-clay-700 ring-1 ring-clay-300",
};

interface SchemaProperty {
  type?: string | string[];
  description?: string;
  enum?: unknown[];
  minimum?: number;
  maximum?: number;
  format?: string;
}

/** The fields of a body or query schema as rows: name, type, required, limits. */
function fieldsOf(schema: z.ZodType): { name: string; type: string; required: boolean; note: string }[] {
  const json = z.toJSONSchema(schema, { io: "input", unrepresentable: "any" }) as {
    properties?: Record<string, SchemaProperty>;
    required?: string[];
  };
  return Object.entries(json.properties ?? {}).map(([name, p]) => ({
    name,
    type: p.enum ? p.enum.map(String).join(" | ") : [p.type].flat().filter(Boolean).join(" | ") + (p.format ? ` (${p.format})` : ""),
    required: json.required?.includes(name) ?? false,
    note: [p.description, p.minimum !== undefined ? `≥ ${p.minimum}` : "", p.maximum !== undefined ? `≤ ${p.maximum}` : ""].filter(Boolean).join(", "),
  }));
}

function accessText(access: Operation["access"]): string {
  if (access === "public") return "anyone";
  if (access === "user") return "any signed-in person";
  const [capability, logger] = access.split("+");
  return `roles with ${capability}${logger ? ", or a logger token" : ""}`;
}

export function OperationCard({ op }: { op: Operation }) {
  const body = op.body ? fieldsOf(op.body) : [];
  const query = op.query ? fieldsOf(op.query) : [];
  return (
    <article className="rounded-2xl bg-white p-4 ring-1 ring-river-100">
      <div className="flex flex-wrap items-center gap-2">
        <span className={`rounded-md px-2 py-0.5 font-mono text-sm font-bold uppercase ${METHOD_STYLE[op.method]}`}>{op.method}</span>
        <code className="break-all font-mono text-sm">{op.path}</code>
      </div>
      <p className="mt-2">{op.summary}</p>
      <p className="text-sm text-ink/70">
        Who: {accessText(op.access)} · answers {op.status ?? 200}
        {op.bodyContentType ? ` · body ${op.bodyContentType}` : ""}
      </p>
      {[
        ["Query", query],
        ["Body", body],
      ].map(([label, rows]) =>
        (rows as typeof body).length > 0 ? (
          <table key={label as string} className="mt-3 w-full text-left text-sm">
            <caption className="text-left font-bold">{label as string}</caption>
            <thead>
              <tr className="text-ink/70">
                <th className="py-1 pr-3 font-normal">name</th>
                <th className="py-1 pr-3 font-normal">type</th>
                <th className="py-1 font-normal">notes</th>
              </tr>
            </thead>
            <tbody>
              {(rows as typeof body).map((f) => (
                <tr key={f.name} className="border-t border-river-50 align-top">
                  <td className="py-1 pr-3 font-mono">
                    {f.name}
                    {f.required ? "" : "?"}
                  </td>
                  <td className="py-1 pr-3">{f.type}</td>
                  <td className="py-1">{f.note}</td>
                </tr>
              ))}
            </tbody>
          </table>
        ) : null,
      )}
    </article>
  );
}

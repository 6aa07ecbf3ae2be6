"use client";

import { useState, type FormEvent } from "react";
import { useSWRConfig } from "swr";
import { SelectField } from "@/components/forms/select-field";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { TextField } from "@/components/ui/text-field";
import { ApiError, sendJson } from "@/lib/client/fetcher";
import { newEntryId } from "@/lib/offline/queue";

/** One input of a set-up form: how it is shown and how its text becomes the API's value. */
export interface InputSpec {
  key: string;
  label: string;
  type: "text" | "number" | "select" | "checkbox";
  options?: { value: string; label: string }[];
  hint?: string;
  /** an empty box sends null (clears the value) instead of leaving the value out */
  nullable?: boolean;
}

type Draft = Record<string, string | boolean>;
type Item = { id: string; name: string; archivedAt: string | null };

function toDraft(specs: InputSpec[], item: Item | null, defaults: Draft): Draft {
  return Object.fromEntries(
    specs.map((s) => {
      const v = item ? (item as Record<string, unknown>)[s.key] : defaults[s.key];
      if (s.type === "checkbox") return [s.key, v === true];
      return [s.key, v === null || v === undefined ? "" : String(v)];
    }),
  );
}

function toBody(specs: InputSpec[], draft: Draft, creating: boolean): Record<string, unknown> {
  const body: Record<string, unknown> = {};
  for (const s of specs) {
    const v = draft[s.key];
    if (s.type === "checkbox") body[s.key] = v === true;
    else if (typeof v === "string" && v.trim() === "") {
      if (s.nullable && !creating) body[s.key] = null;
    } else if (s.type === "number") body[s.key] = Number(String(v).replace(",", "."));
    else body[s.key] = v;
  }
  return body;
}

/**
 * A list of one kind of farm equipment (gauges, stations, systems) with a form to add or change one.
 * Saving goes through the REST API; the list's key is revalidated after.
 */
export function RecordEditor<T extends Item>({
  title,
  noun,
  collectionUrl,
  listKey,
  items,
  specs,
  defaults,
  describe,
}: {
  title: string;
  noun: string;
  collectionUrl: string;
  listKey: string;
  items: T[];
  specs: InputSpec[];
  defaults: Draft;
  describe: (item: T) => string;
}) {
  const { mutate } = useSWRConfig();
  const [editing, setEditing] = useState<T | "new" | null>(null);
  const [draft, setDraft] = useState<Draft>({});
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<{ tone: "success" | "problem"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  function open(item: T | "new") {
    setEditing(item);
    setDraft(toDraft(specs, item === "new" ? null : item, defaults));
    setErrors({});
    setMessage(null);
  }

  async function save(ev: FormEvent) {
    ev.preventDefault();
    if (!editing) return;
    setBusy(true);
    try {
      const creating = editing === "new";
      const body = toBody(specs, draft, creating);
      if (creating) await sendJson(collectionUrl, "POST", { ...body, id: newEntryId() });
      else await sendJson(`${collectionUrl}/${editing.id}`, "PATCH", body);
      await mutate(listKey);
      setMessage({ tone: "success", text: `${String(draft.name ?? noun)} saved.` });
      setEditing(null);
    } catch (err) {
      const e = err instanceof ApiError ? err : null;
      setErrors(e?.fields ?? {});
      setMessage({ tone: "problem", text: e?.message ?? "Could not save: check the connection and try again." });
    } finally {
      setBusy(false);
    }
  }

  const live = items.filter((i) => i.archivedAt === null);
  const headingId = `${noun.replace(/\W+/g, "-")}-heading`;
  return (
    <section aria-labelledby={headingId} className="flex flex-col gap-3 rounded-2xl bg-white p-4 shadow-sm ring-1 ring-river-100">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id={headingId} className="text-xl font-bold">
          {title}
        </h2>
        <Button variant="secondary" onClick={() => open("new")}>
          Add {noun}
        </Button>
      </div>
      {message && !editing && <Notice tone={message.tone}>{message.text}</Notice>}
      {live.length === 0 ? (
        <p className="text-ink/70">None yet.</p>
      ) : (
        <ul className="flex flex-col divide-y divide-river-100">
          {live.map((item) => (
            <li key={item.id} className="flex items-center justify-between gap-2 py-2">
              <div className="min-w-0">
                <p className="font-bold">{item.name}</p>
                <p className="text-sm text-ink/80">{describe(item)}</p>
              </div>
              <Button variant="quiet" onClick={() => open(item)} aria-label={`Edit ${item.name}`}>
                Edit
              </Button>
            </li>
          ))}
        </ul>
      )}
      {editing && (
        <form onSubmit={save} noValidate className="flex flex-col gap-3 rounded-xl bg-paper p-3 ring-1 ring-river-100" aria-label={editing === "new" ? `New ${noun}` : `Edit ${editing.name}`}>
          <h3 className="font-bold">{editing === "new" ? `New ${noun}` : `Edit ${editing.name}`}</h3>
          {message?.tone === "problem" && <Notice tone="problem">{message.text}</Notice>}
          <div className="grid gap-3 sm:grid-cols-2">
            {specs.map((s) => {
              const id = `${noun.replace(/\W+/g, "-")}-${s.key}`;
              const value = draft[s.key];
              if (s.type === "checkbox") {
                return (
                  <label key={s.key} className="tap flex items-center gap-3 rounded-xl bg-white px-3 ring-1 ring-river-300">
                    <input type="checkbox" className="h-6 w-6" checked={value === true} onChange={(e) => setDraft({ ...draft, [s.key]: e.target.checked })} />
                    <span>{s.label}</span>
                  </label>
                );
              }
              if (s.type === "select") {
                return (
                  <SelectField
                    key={s.key}
                    id={id}
                    label={s.label}
                    value={String(value ?? "")}
                    options={s.options ?? []}
                    error={errors[s.key]}
                    onChange={(e) => setDraft({ ...draft, [s.key]: e.target.value })}
                  />
                );
              }
              return (
                <TextField
                  key={s.key}
                  id={id}
                  label={s.label}
                  hint={s.hint}
                  inputMode={s.type === "number" ? "decimal" : undefined}
                  value={String(value ?? "")}
                  error={errors[s.key]}
                  onChange={(e) => setDraft({ ...draft, [s.key]: e.target.value })}
                />
              );
            })}
          </div>
          <div className="flex flex-wrap gap-2">
            <Button type="submit" disabled={busy}>
              Save {noun}
            </Button>
            <Button type="button" variant="quiet" onClick={() => setEditing(null)}>
              Cancel
            </Button>
          </div>
        </form>
      )}
    </section>
  );
}

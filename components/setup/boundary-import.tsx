"use client";

import { useState, type FormEvent } from "react";
import { useSWRConfig } from "swr";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { TextField } from "@/components/ui/text-field";
import { ApiError, fetchJson } from "@/lib/client/fetcher";
import { setupKeys } from "@/lib/client/use-farm-setup";

interface ImportAnswer {
  id: string;
  status: "processing" | "done" | "rejected" | "failed";
  counts: Record<string, number>;
  report: { rejected: { line: number; reason: string }[]; warnings: string[] } | null;
  repeat?: boolean;
}

const POLL_MS = 1_500;
const MAX_POLLS = 80;

function describe(a: ImportAnswer): string {
  const counts = Object.entries(a.counts ?? {})
    .filter(([, n]) => typeof n === "number" && n > 0)
    .map(([k, n]) => `${n} ${k}`)
    .join(", ");
  const repeat = a.repeat ? " This file was imported before." : "";
  return `${counts || "Nothing changed."}${repeat}`;
}

/** Sends a boundary file (GeoJSON, KML or a zipped shapefile) to the import API and waits for its report. */
export function BoundaryImport({ farmId }: { farmId: string }) {
  const { mutate } = useSWRConfig();
  const [file, setFile] = useState<File | null>(null);
  const [nameProperty, setNameProperty] = useState("name");
  const [result, setResult] = useState<{ tone: "success" | "problem" | "info"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(ev: FormEvent) {
    ev.preventDefault();
    if (!file) {
      setResult({ tone: "problem", text: "Choose a GeoJSON, KML or zipped shapefile first." });
      return;
    }
    const form = new FormData();
    form.set("file", file, file.name);
    form.set("kind", "boundaries");
    form.set("options", JSON.stringify({ nameProperty: nameProperty.trim() || "name", createMissing: true, writeGoodRows: true }));
    setBusy(true);
    setResult({ tone: "info", text: `Reading ${file.name}…` });
    try {
      const res = await fetch(`/api/v1/farms/${farmId}/imports`, { method: "POST", body: form, headers: { Accept: "application/json" } });
      const body = (await res.json()) as ImportAnswer & { error?: { message: string; fields?: Record<string, string> } };
      if (!res.ok) throw new ApiError(res.status, "import", body.error?.message ?? `The server answered ${res.status}.`, body.error?.fields);
      let answer: ImportAnswer = body;
      for (let i = 0; answer.status === "processing" && i < MAX_POLLS; i++) {
        await new Promise((r) => setTimeout(r, POLL_MS));
        answer = await fetchJson<ImportAnswer>(`/api/v1/farms/${farmId}/imports/${answer.id}`);
      }
      await mutate(setupKeys.fields(farmId));
      const ok = answer.status === "done";
      const why = answer.report?.rejected.map((r) => `Feature ${r.line}: ${r.reason}`).join(" ") ?? "";
      setResult({ tone: ok ? "success" : "problem", text: ok ? `Imported: ${describe(answer)}` : `Not imported (${answer.status}). ${why}` });
    } catch (err) {
      const fields = err instanceof ApiError ? Object.values(err.fields).join(" ") : "";
      setResult({ tone: "problem", text: `${err instanceof Error ? err.message : "The import failed."} ${fields}` });
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-3" aria-label="Import boundaries">
      <p className="text-ink/80">A file with one outline per field. Outlines are matched to fields by name; new names become new fields.</p>
      <div className="flex flex-col gap-1">
        <label htmlFor="boundary-file" className="text-sm font-bold">
          Boundary file (.geojson, .kml or .zip shapefile)
        </label>
        <input
          id="boundary-file"
          type="file"
          accept=".geojson,.json,.kml,.zip,application/geo+json,application/vnd.google-earth.kml+xml,application/zip"
          onChange={(e) => setFile(e.target.files?.[0] ?? null)}
          className="tap rounded-xl border border-river-300 bg-white px-3 py-2 file:mr-3 file:rounded-lg file:border-0 file:bg-river-50 file:px-3 file:py-2 file:font-bold file:text-river-900"
        />
      </div>
      <TextField id="boundary-name-property" label="Property holding the field's name" value={nameProperty} onChange={(e) => setNameProperty(e.target.value)} />
      {result && <Notice tone={result.tone}>{result.text}</Notice>}
      <Button type="submit" disabled={busy} className="self-start">
        Import outlines
      </Button>
    </form>
  );
}

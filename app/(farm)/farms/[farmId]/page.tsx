import type { Metadata } from "next";
import { getFarm } from "@/db/farms";
import { listFieldSummaries } from "@/db/fields";
import { requireFarmPage } from "@/lib/auth/session";
import { farmToday } from "@/lib/farm-time";

export const metadata: Metadata = { title: "Fields" };

export default async function FarmPage({ params }: { params: Promise<{ farmId: string }> }) {
  const { farmId } = await params;
  await requireFarmPage(farmId, "view");
  const farm = (await getFarm(farmId))!;
  const today = farmToday(farm.timeZone);
  const fields = await listFieldSummaries(farmId, today);
  const totalHa = fields.reduce((sum, f) => sum + f.areaHa, 0);
  return (
    <section aria-labelledby="fields-heading" className="flex flex-col gap-4">
      <div className="flex flex-wrap items-baseline justify-between gap-x-3">
        <h1 id="fields-heading" className="text-2xl font-bold">
          Fields
        </h1>
        <p className="text-sm text-ink/70">
          {fields.length} fields · {totalHa.toFixed(1)} ha · {today} ({farm.timeZone})
        </p>
      </div>
      <ul className="grid gap-3 sm:grid-cols-2">
        {fields.map((f) => (
          <li key={f.id} className="rounded-2xl bg-white px-4 py-3 shadow-sm ring-1 ring-river-100">
            <p className="text-lg font-bold">{f.name}</p>
            <p className="text-sm text-ink/80">
              {f.areaHa.toFixed(1)} ha · {f.cropName ?? "fallow"} · {f.soilName ?? "soil not set"}
            </p>
            <p className="text-sm text-ink/70">{f.systemName ?? "no irrigation system"}</p>
          </li>
        ))}
      </ul>
    </section>
  );
}

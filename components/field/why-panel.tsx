import type { AccountDayDto } from "@/lib/client/use-field-account";
import type { FieldOutlookDto } from "@/lib/client/use-field-outlook";
import type { GaugeDto } from "@/lib/client/use-gauges";
import { formatDepth, formatLocalDate, type UnitSystem } from "@/lib/units";

const ETO_METHODS: Record<string, string> = {
  given: "given by the station",
  "penman-monteith": "FAO-56 Penman-Monteith",
  hargreaves: "Hargreaves (temperatures only)",
  "filled-mean": "filled from the mean of nearby days",
};

const dayCount = (n: number) => (n === 1 ? "1 day" : `${n} days`);

const ESTIMATED: Record<string, string> = { solar: "solar radiation", humidity: "humidity", wind: "wind speed", eto: "ETo itself" };

function countBy<T>(items: readonly T[], key: (t: T) => string | undefined): [string, number][] {
  const m = new Map<string, number>();
  for (const t of items) {
    const k = key(t);
    if (k !== undefined) m.set(k, (m.get(k) ?? 0) + 1);
  }
  return [...m].sort((a, b) => b[1] - a[1]);
}

/** Why the account says what it says: where each term of the shown days came from. */
export function WhyPanel({ days, outlook, gauges, units }: { days: readonly AccountDayDto[]; outlook: FieldOutlookDto | undefined; gauges: readonly GaugeDto[]; units: UnitSystem }) {
  const gaugeName = new Map(gauges.map((g) => [g.id, g.name]));
  const last = days[days.length - 1];
  const etoMethods = countBy(days, (d) => d.provenance.eto?.method);
  const estimated = countBy(days.flatMap((d) => d.provenance.eto?.estimated ?? []), (e) => e);
  const rainLast = [...days].reverse().find((d) => d.provenance.rain && d.provenance.rain.gauges.length > 0)?.provenance.rain;
  const missingRain = days.filter((d) => d.provenance.rain?.missing).length;
  const runoff = countBy(days.filter((d) => (d.rainMm ?? 0) > 0), (d) => d.provenance.runoff?.method);
  const cn = [...days].reverse().find((d) => d.provenance.runoff?.method === "curve-number")?.provenance.runoff;
  const qc = days.filter((d) => d.provenance.qc);
  const checks = days.filter((d) => d.soilCheckReset);
  const recentMean = outlook?.days.filter((d) => d.etoSource === "recent-mean").length ?? 0;
  return (
    <section aria-labelledby="why" className="flex flex-col gap-3 rounded-2xl bg-white p-4 ring-1 ring-river-100">
      <h2 id="why" className="text-lg font-bold">
        Why these numbers
      </h2>
      <dl className="flex flex-col gap-3 text-sm">
        <div>
          <dt className="font-bold">Reference ET (ETo)</dt>
          <dd>
            {etoMethods.length ? etoMethods.map(([m, n]) => `${ETO_METHODS[m] ?? m}: ${dayCount(n)}`).join("; ") : "no days shown"}.
            {estimated.length > 0 && (
              <span className="ml-1">
                <Estimated /> inputs estimated (FAO-56 ch. 3): {estimated.map(([e, n]) => `${ESTIMATED[e] ?? e} on ${dayCount(n)}`).join(", ")}.
              </span>
            )}
          </dd>
        </div>
        <div>
          <dt className="font-bold">Rain</dt>
          <dd>
            {rainLast
              ? `${rainLast.source === "own-gauge" ? "From the field's own gauge" : "Shared from nearby gauges by inverse distance"}: ${rainLast.gauges
                  .map((g) => `${gaugeName.get(g.gaugeId) ?? "a gauge"} ${g.distanceKm.toFixed(1)} km, weight ${Math.round(g.weight * 100)} %`)
                  .join("; ")}.`
              : "No gauge reading reached this field in these days."}
            {missingRain > 0 && <span className="ml-1 font-bold text-clay-700">{missingRain} days with a missing reading, counted as no rain.</span>}
          </dd>
        </div>
        <div>
          <dt className="font-bold">Runoff</dt>
          <dd>
            {runoff.length
              ? runoff.map(([m, n]) => `${m === "green-ampt" ? "Green-Ampt from the storm's intensity" : m === "curve-number" ? "NRCS curve number" : "none"}: ${n === 1 ? "1 rain day" : `${n} rain days`}`).join("; ")
              : "No rain days shown."}
            {cn && cn.method === "curve-number" && ` Last curve number ${cn.curveNumber} (${cn.condition} antecedent condition).`}
          </dd>
        </div>
        {last && (
          <div>
            <dt className="font-bold">Crop and root zone (last day)</dt>
            <dd>
              Kc {last.kc?.toFixed(2) ?? "—"}, Ks {last.ks?.toFixed(2) ?? "—"}, p {last.pAdjusted?.toFixed(2) ?? "—"}, root depth {last.rootDepthM?.toFixed(2) ?? "—"} m
              {last.provenance.stage ? `, stage ${last.provenance.stage}` : ""}; TAW {formatDepth(last.tawMm, units)}, RAW {formatDepth(last.rawMm, units)}.
            </dd>
          </div>
        )}
        <div>
          <dt className="font-bold">Quality-control flags</dt>
          <dd>{qc.length ? qc.map((d) => `${formatLocalDate(d.date)}: ${d.provenance.qc}`).join("; ") : "None on these days."}</dd>
        </div>
        {checks.length > 0 && (
          <div>
            <dt className="font-bold">Soil checks</dt>
            <dd>The account was reset to a measured depletion on {checks.map((d) => formatLocalDate(d.date)).join(", ")}.</dd>
          </div>
        )}
        {outlook && (
          <div>
            <dt className="font-bold">Outlook</dt>
            <dd>
              {recentMean > 0 ? (
                <>
                  <Estimated /> {recentMean} of {outlook.days.length} days use the recent mean ETo ({formatDepth(outlook.meanEtoMm, units, 1)}/day) for want of a forecast.
                </>
              ) : (
                "Every day uses forecast ETo."
              )}{" "}
              Forecast rain is not counted.
            </dd>
          </div>
        )}
      </dl>
    </section>
  );
}

/** The visible mark of an estimated input. */
export function Estimated() {
  return (
    <abbr title="estimated" className="rounded bg-clay-100 px-1 text-xs font-bold text-clay-900 no-underline">
      est.
    </abbr>
  );
}

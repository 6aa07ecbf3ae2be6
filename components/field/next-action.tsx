import type { FieldOutlookDto } from "@/lib/client/use-field-outlook";
import type { IrrigationSystemDto } from "@/lib/client/use-systems";
import { formatDepth, formatHours, formatLocalDate, formatVolume, relativeDay, type UnitSystem } from "@/lib/units";
import { EstimateCaution } from "./estimate-caution";

/** The next irrigation in plain words: when, how much (net and gross), and for how long on the field's system. */
export function NextAction({
  outlook,
  system,
  today,
  units,
}: {
  outlook: FieldOutlookDto;
  system: IrrigationSystemDto | undefined;
  today: string;
  units: UnitSystem;
}) {
  const when = outlook.dueNow
    ? "Irrigate now: the field is at or past its trigger."
    : outlook.triggerDate
      ? `Irrigate by ${formatLocalDate(outlook.triggerDate)} (${relativeDay(outlook.triggerDate, today)}).`
      : `No irrigation due in the next ${outlook.days.length} days.`;
  const due = outlook.dueNow || outlook.triggerDate !== null;
  return (
    <section aria-labelledby="next-action" className="flex flex-col gap-3 rounded-2xl bg-white p-4 ring-1 ring-river-100">
      <h2 id="next-action" className="text-lg font-bold">
        Next action
      </h2>
      <p className="text-xl font-bold">{when}</p>
      {due && (
        <dl className="grid grid-cols-2 gap-x-4 gap-y-1 text-sm sm:grid-cols-4">
          <div>
            <dt className="text-ink/75">Net depth</dt>
            <dd className="font-bold">{formatDepth(outlook.netDepthMm, units, 1)}</dd>
          </div>
          <div>
            <dt className="text-ink/75">Gross depth</dt>
            <dd className="font-bold">{formatDepth(outlook.grossDepthMm, units, 1)}</dd>
          </div>
          <div>
            <dt className="text-ink/75">Volume</dt>
            <dd className="font-bold">{formatVolume(outlook.grossVolumeM3, units)}</dd>
          </div>
          <div>
            <dt className="text-ink/75">Run time{system ? ` on ${system.name}` : ""}</dt>
            <dd className="font-bold">
              {outlook.runTimeH !== null ? formatHours(outlook.runTimeH) : system ? "set the system's flow" : "no system set"}
            </dd>
          </div>
        </dl>
      )}
      <p className="text-sm text-ink/80">
        Net depth refills the root zone to field capacity; gross depth adds what the system loses
        {system ? ` (application efficiency ${Math.round(system.applicationEfficiency * 100)} %)` : ""}.
      </p>
      <EstimateCaution />
    </section>
  );
}

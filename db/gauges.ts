import "server-only";
import { GAUGE_ACCOUNT_KEYS, gaugeSchema, type GaugeCreate, type GaugeValues } from "@/lib/validation/gauge";
import { farmEquipment, type Equipment } from "./farm-equipment";

export type Gauge = Equipment<GaugeValues>;

const gauges = farmEquipment<GaugeValues>({
  table: "gauges",
  entity: "gauge",
  columns: {
    name: "name",
    kind: "kind",
    latitude: "latitude",
    longitude: "longitude",
    resolutionMm: "resolution_mm",
  },
  schema: gaugeSchema,
  createDefaults: { latitude: null, longitude: null, resolutionMm: null },
  nameTaken: { message: "This farm already has a gauge with that name.", field: "Already used by another gauge on this farm" },
  accountKeys: GAUGE_ACCOUNT_KEYS,
  // Rain is shared between gauges by distance, so any field of the farm may draw on this one.
  fieldsUsing: (trx, farmId) => trx("fields").where({ farm_id: farmId }).pluck("id"),
});

export const toGauge = gauges.toItem;

/** The farm's gauges in use, by name; archived ones only when asked for. */
export const listGauges = gauges.list;

export const getGauge = gauges.get;

export async function createGauge(farmId: string, userId: string, input: GaugeCreate): Promise<{ gauge: Gauge; created: boolean }> {
  const { item, created } = await gauges.create(farmId, userId, input);
  return { gauge: item, created };
}

export const updateGauge = gauges.update;

/** Archives a gauge: its readings stay part of past accounts; fields that name it keep it until changed. */
export const archiveGauge = gauges.archive;

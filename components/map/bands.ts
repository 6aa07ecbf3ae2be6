import type { FieldStatusDto } from "@/lib/client/use-farm-status";

/**
 * The farm map's five status bands, wet to dry, in Rootbank's own words and colours (one sequence from
 * deep water to burnt clay, so the order reads without red and green). They refine the API's bands:
 * `comfortable` splits into soaked and comfortable at {@link SOAKED_FRACTION} of TAW.
 */
export type MapBand = "soaked" | "comfortable" | "drawing" | "due" | "parched" | "unknown";

/** Depletion below this share of TAW counts as soaked: the root zone is close to field capacity (common practice, no source). */
export const SOAKED_FRACTION = 0.1;

export const BANDS: Record<MapBand, { label: string; meaning: string; fill: string; text: string }> = {
  soaked: { label: "Soaked", meaning: "near field capacity", fill: "#1d5566", text: "#ffffff" },
  comfortable: { label: "Comfortable", meaning: "well short of the trigger", fill: "#5fa3b6", text: "#0f3340" },
  drawing: { label: "Drawing down", meaning: "trigger within 3 days", fill: "#d8c48f", text: "#17261f" },
  due: { label: "Due", meaning: "at or past the trigger", fill: "#d08a3c", text: "#17261f" },
  parched: { label: "Parched", meaning: "beyond RAW: the crop is short of water", fill: "#8f3b1b", text: "#ffffff" },
  unknown: { label: "No account yet", meaning: "needs soil, crop and weather", fill: "#c9c6bd", text: "#17261f" },
};

/** Wet to dry, for the legend. */
export const BAND_ORDER: readonly MapBand[] = ["soaked", "comfortable", "drawing", "due", "parched", "unknown"];

export function mapBand(s: FieldStatusDto): MapBand {
  switch (s.band) {
    case "stressed":
      return "parched";
    case "due":
      return "due";
    case "drying":
      return "drawing";
    case "comfortable":
      return s.depletionMm !== null && s.tawMm !== null && s.tawMm > 0 && s.depletionMm < SOAKED_FRACTION * s.tawMm ? "soaked" : "comfortable";
    default:
      return "unknown";
  }
}

const URGENCY: Record<MapBand, number> = { parched: 0, due: 1, drawing: 2, comfortable: 3, soaked: 4, unknown: 5 };

/** Most urgent first: by band, then fewest days to the trigger, then the drier share of TAW. */
export function byUrgency(a: FieldStatusDto, b: FieldStatusDto): number {
  const band = URGENCY[mapBand(a)] - URGENCY[mapBand(b)];
  if (band !== 0) return band;
  const da = a.daysUntilTrigger ?? Number.POSITIVE_INFINITY;
  const db = b.daysUntilTrigger ?? Number.POSITIVE_INFINITY;
  if (da !== db) return da - db;
  const fa = a.depletionMm !== null && a.tawMm ? a.depletionMm / a.tawMm : -1;
  const fb = b.depletionMm !== null && b.tawMm ? b.depletionMm / b.tawMm : -1;
  return fb - fa || a.name.localeCompare(b.name);
}

/** "due now", "trigger within a day", "3 days to trigger", or "trigger not in sight". */
export function triggerWords(s: FieldStatusDto): string {
  if (s.band === "no-account") return "no account yet";
  if (s.band === "due" || s.band === "stressed") return "due now";
  if (s.daysUntilTrigger === null) return "trigger not in sight";
  if (s.daysUntilTrigger === 0) return "trigger within a day";
  if (s.daysUntilTrigger === 1) return "1 day to trigger";
  return `${s.daysUntilTrigger} days to trigger`;
}

/** The short form on the map's labels: "due", "<1 d", "3 d". */
export function triggerShort(s: FieldStatusDto): string {
  if (s.band === "due" || s.band === "stressed") return "due";
  if (s.daysUntilTrigger === null) return "–";
  return s.daysUntilTrigger === 0 ? "<1 d" : `${s.daysUntilTrigger} d`;
}

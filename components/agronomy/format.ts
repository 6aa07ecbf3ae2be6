/** Labels and number formats shared by the agronomy screens. */

/** A crop curve's numbers as a person edits them: on a planting's curve and on a farm's crop copy. */
export const CURVE_NUMBER_KEYS = [
  "kcIni",
  "kcMid",
  "kcEnd",
  "stageIniDays",
  "stageDevDays",
  "stageMidDays",
  "stageLateDays",
  "rootMinM",
  "rootMaxM",
  "p",
] as const;

export const CURVE_LABELS: Record<string, string> = {
  kcIni: "Kc ini",
  kcMid: "Kc mid",
  kcEnd: "Kc end",
  kcbIni: "Kcb ini",
  kcbMid: "Kcb mid",
  kcbEnd: "Kcb end",
  stageIniDays: "Initial stage (days)",
  stageDevDays: "Development stage (days)",
  stageMidDays: "Mid-season stage (days)",
  stageLateDays: "Late-season stage (days)",
  rootMinM: "Root depth at sowing (m)",
  rootMaxM: "Maximum root depth (m)",
  p: "p (depletion fraction before stress)",
  mad: "Trigger (MAD, share of TAW)",
  climateAdjust: "Adjust Kc mid and end for climate",
  kcScale: "Kc scale (calibration)",
  heightM: "Crop height (m)",
  curveNumber: "Curve number",
  runoffCover: "Runoff cover",
  thetaFc: "θ at field capacity (m³/m³)",
  thetaWp: "θ at wilting point (m³/m³)",
  thetaSat: "θ at saturation (m³/m³)",
  rewMm: "REW (mm)",
  tewMm: "TEW (mm)",
  gaSuctionMm: "Wetting-front suction (mm)",
  gaKsatMmH: "Ksat (mm/h)",
  gaPorosity: "Porosity",
  gaEffectivePorosity: "Effective porosity",
  hydrologicGroup: "Hydrologic group",
  texture: "Texture",
  name: "Name",
  season: "Season",
  plantingDate: "Planting date",
  endDate: "End date",
  cropId: "Crop",
  initialDepletionMm: "Initial depletion (mm)",
  note: "Note",
  source: "Source",
  yieldTHa: "Yield (t/ha)",
};

export function label(key: string): string {
  return CURVE_LABELS[key] ?? key;
}

/** A stored value as text: numbers without float noise, null as a dash. */
export function show(value: unknown): string {
  if (value === null || value === undefined || value === "") return "—";
  if (typeof value === "number") return String(Math.round(value * 1000) / 1000);
  if (typeof value === "boolean") return value ? "yes" : "no";
  return String(value);
}

export function mm(value: number | null | undefined): string {
  return value === null || value === undefined ? "—" : `${value.toFixed(1)} mm`;
}

export function when(iso: string): string {
  return new Date(iso).toLocaleString("en-AU", { dateStyle: "medium", timeStyle: "short" });
}

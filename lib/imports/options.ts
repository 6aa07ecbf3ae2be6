/**
 * What the person importing a file tells Rootbank about it: its kind, the column mapping and units,
 * and whether good rows may be written when some are rejected. One schema per kind.
 */
import { z } from "zod";
import { AppError } from "@/lib/api/errors";
import { DATE_ORDERS } from "./csv";
import { RAIN_UNITS, SOLAR_UNITS, TEMPERATURE_UNITS, WIND_UNITS } from "./units";

export const IMPORT_KINDS = ["weather_csv", "rain_csv", "gauge_readings_csv", "boundaries"] as const;
export type ImportKind = (typeof IMPORT_KINDS)[number];

const column = z.string().trim().min(1).max(200);

const common = {
  /** false (default): nothing is written if any row is rejected; true: the good rows are written */
  writeGoodRows: z.boolean().default(false),
  dateOrder: z.enum(DATE_ORDERS).default("ymd"),
};

export const weatherOptionsSchema = z.object({
  ...common,
  stationId: z.uuid(),
  interval: z.enum(["daily", "hourly"]).default("daily"),
  /** minutes between hourly-file rows (60 for hourly, 10 or 15 for loggers that write more often) */
  intervalMinutes: z.number().int().min(1).max(60).default(60),
  /** whether a sub-daily row's time stamp marks the end (most loggers) or the start of its interval */
  stampMarks: z.enum(["end", "start"]).default("end"),
  columns: z.object({
    date: column,
    tmax: column.optional(),
    tmin: column.optional(),
    /** hourly files: the air temperature of the interval */
    temp: column.optional(),
    rhMax: column.optional(),
    rhMin: column.optional(),
    rh: column.optional(),
    wind: column.optional(),
    solar: column.optional(),
    rain: column.optional(),
  }),
  units: z
    .object({
      temperature: z.enum(TEMPERATURE_UNITS).default("C"),
      wind: z.enum(WIND_UNITS).default("m/s"),
      solar: z.enum(SOLAR_UNITS).default("MJ/m2"),
      rain: z.enum(RAIN_UNITS).default("mm"),
    })
    .prefault({}),
});

export const rainOptionsSchema = z.object({
  ...common,
  gaugeId: z.uuid(),
  /** 'tips': one row per bucket tip; 'intervals': one row per logger interval with its depth */
  mode: z.enum(["tips", "intervals"]),
  columns: z.object({ time: column, depth: column.optional() }),
  units: z.object({ rain: z.enum(RAIN_UNITS).default("mm") }).prefault({}),
  /** depth of one tip, mm; defaults to the gauge's resolution */
  tipMm: z.number().positive().max(5).optional(),
  /** length of each logger interval, s; when absent, the gap to the row before */
  intervalS: z.number().int().positive().max(86400).optional(),
});

export const gaugeReadingsOptionsSchema = z.object({
  ...common,
  columns: z.object({ gauge: column, time: column, depth: column }),
  units: z.object({ rain: z.enum(RAIN_UNITS).default("mm") }).prefault({}),
});

export const boundaryOptionsSchema = z.object({
  writeGoodRows: z.boolean().default(false),
  /** the feature property holding the field's name */
  nameProperty: z.string().trim().min(1).default("name"),
  /** create a field for a name that matches none (otherwise such a feature is rejected) */
  createMissing: z.boolean().default(true),
  format: z.enum(["geojson", "kml", "shapefile"]).optional(),
});

export type WeatherOptions = z.infer<typeof weatherOptionsSchema>;
export type RainOptions = z.infer<typeof rainOptionsSchema>;
export type GaugeReadingsOptions = z.infer<typeof gaugeReadingsOptionsSchema>;
export type BoundaryOptions = z.infer<typeof boundaryOptionsSchema>;

export type ImportRequest =
  | { kind: "weather_csv"; options: WeatherOptions }
  | { kind: "rain_csv"; options: RainOptions }
  | { kind: "gauge_readings_csv"; options: GaugeReadingsOptions }
  | { kind: "boundaries"; options: BoundaryOptions };

const SCHEMAS = {
  weather_csv: weatherOptionsSchema,
  rain_csv: rainOptionsSchema,
  gauge_readings_csv: gaugeReadingsOptionsSchema,
  boundaries: boundaryOptionsSchema,
} as const;

/** Validates the options for a kind; errors name `options.<path>`. */
export function parseImportRequest(kind: ImportKind, options: unknown): ImportRequest {
  const result = SCHEMAS[kind].safeParse(options);
  if (!result.success) {
    const fields: Record<string, string> = {};
    for (const issue of result.error.issues) fields[["options", ...issue.path].join(".")] ??= issue.message;
    throw new AppError("invalid", "The import options are not valid.", fields);
  }
  return { kind, options: result.data } as ImportRequest;
}

/** The multipart form's text fields, as the OpenAPI document describes them. */
export const importFormSchema = z.object({
  file: z.string().describe("the file (multipart part with a file name)"),
  kind: z.enum(IMPORT_KINDS),
  options: z.string().describe("JSON object of options for the kind"),
});

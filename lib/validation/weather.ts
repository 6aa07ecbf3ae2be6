import { z } from "zod";

export const WEATHER_KINDS = ["observed", "forecast"] as const;

const opt = (schema: z.ZodNumber) => schema.nullable().optional();
const celsius = () => z.number().min(-90).max(60);
const pct = () => z.number().min(0).max(100);

/** One station day. Every measurement may be missing: the engine estimates what is absent (FAO-56 ch. 3). */
export const weatherDaySchema = z
  .object({
    date: z.iso.date({ message: "Use an ISO date, e.g. 2026-11-29" }),
    kind: z.enum(WEATHER_KINDS).optional(),
    tmaxC: opt(celsius()),
    tminC: opt(celsius()),
    rhMaxPct: opt(pct()),
    rhMinPct: opt(pct()),
    rhMeanPct: opt(pct()),
    windMs: opt(z.number().min(0).max(60)),
    solarMJm2: opt(z.number().min(0).max(50)),
    sunshineH: opt(z.number().min(0).max(24)),
    rainMm: opt(z.number().min(0).max(1000)),
    etoMm: opt(z.number().min(0).max(30)),
  })
  .refine((d) => d.tmaxC == null || d.tminC == null || d.tmaxC >= d.tminC, { message: "The maximum is below the minimum", path: ["tmaxC"] })
  .refine((d) => d.rhMaxPct == null || d.rhMinPct == null || d.rhMaxPct >= d.rhMinPct, {
    message: "The maximum is below the minimum",
    path: ["rhMaxPct"],
  });

export const weatherDaysSchema = z.object({
  stationId: z.uuid(),
  /** where the values come from, e.g. 'station logger', 'bureau forecast' */
  source: z.string().trim().min(1, "Say where the values come from").max(100),
  /** the kind of every day that does not give its own */
  kind: z.enum(WEATHER_KINDS).default("observed"),
  days: z.array(weatherDaySchema).min(1, "Send at least one day").max(1000, "Send at most 1000 days per request"),
});

export type WeatherDaysInput = z.infer<typeof weatherDaysSchema>;
export type WeatherDayInput = z.infer<typeof weatherDaySchema>;

export const weatherQuerySchema = z.object({
  stationId: z.uuid().optional(),
  from: z.iso.date().optional(),
  to: z.iso.date().optional(),
  kind: z.enum(WEATHER_KINDS).optional(),
});

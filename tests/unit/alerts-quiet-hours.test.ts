import { describe, expect, it } from "vitest";
import { isQuiet, nextDigestTime, nextSendTime } from "@/lib/alerts/quiet-hours";
import { backoffMinutes } from "@/lib/alerts/backoff";
import { defaultRule, effectiveRules, passesThreshold } from "@/lib/alerts/rules";

// Instants and offsets: Australia/Sydney is UTC+11 in December (daylight time), from memory.
const TZ = "Australia/Sydney";
const at = (iso: string) => new Date(iso);

describe("quiet hours in the farm's zone", () => {
  const night = { start: "21:30", end: "06:00" };

  it("spans midnight when the start is after the end", () => {
    expect(isQuiet(at("2026-12-02T11:00:00Z"), TZ, night)).toBe(true); // 22:00 local
    expect(isQuiet(at("2026-12-02T18:59:00Z"), TZ, night)).toBe(true); // 05:59 local
    expect(isQuiet(at("2026-12-02T19:00:00Z"), TZ, night)).toBe(false); // 06:00 local: the end is not quiet
    expect(isQuiet(at("2026-12-02T03:00:00Z"), TZ, night)).toBe(false); // 14:00 local
  });

  it("holds a message made at 22:00 until 06:00 the next local morning", () => {
    expect(nextSendTime(at("2026-12-02T11:00:00Z"), TZ, night).toISOString()).toBe("2026-12-02T19:00:00.000Z");
  });

  it("holds a message made after midnight until 06:00 the same local day", () => {
    expect(nextSendTime(at("2026-12-02T15:00:00Z"), TZ, night).toISOString()).toBe("2026-12-02T19:00:00.000Z"); // 02:00 local
  });

  it("sends at once outside quiet hours, or without any", () => {
    const t = at("2026-12-02T03:00:00Z");
    expect(nextSendTime(t, TZ, night)).toBe(t);
    expect(nextSendTime(t, TZ, null)).toBe(t);
    expect(isQuiet(t, TZ, { start: "08:00", end: "08:00" })).toBe(false);
  });

  it("handles a daytime window", () => {
    const siesta = { start: "12:00", end: "15:00" };
    expect(nextSendTime(at("2026-12-02T02:30:00Z"), TZ, siesta).toISOString()).toBe("2026-12-02T04:00:00.000Z"); // 13:30 → 15:00 local
  });

  it("puts the digest at the next local digest hour", () => {
    expect(nextDigestTime(at("2026-12-02T11:00:00Z"), TZ, 6).toISOString()).toBe("2026-12-02T19:00:00.000Z"); // 22:00 → 06:00
    expect(nextDigestTime(at("2026-12-02T18:00:00Z"), TZ, 6).toISOString()).toBe("2026-12-02T19:00:00.000Z"); // 05:00 → 06:00
    expect(nextDigestTime(at("2026-12-02T20:00:00Z"), TZ, 6).toISOString()).toBe("2026-12-03T19:00:00.000Z"); // 07:00 → next day
  });
});

describe("rules", () => {
  it("gives managers pushes, viewers nothing, and keeps stored changes over the defaults", () => {
    expect(defaultRule("manager", "field-trigger")).toMatchObject({ enabled: true, push: true, email: true });
    expect(defaultRule("viewer", "field-trigger").enabled).toBe(false);
    expect(defaultRule("worker", "gauge-missed").push).toBe(true);
    const rules = effectiveRules("manager", [{ kind: "rain-skip", enabled: false, push: false, email: false, threshold: 25 }]);
    expect(rules.find((r) => r.kind === "rain-skip")).toMatchObject({ enabled: false, threshold: 25 });
    expect(rules).toHaveLength(6);
  });

  it("compares thresholds the right way round", () => {
    const outlook = defaultRule("manager", "outlook-trigger"); // 2 days
    expect(passesThreshold(outlook, 2)).toBe(true);
    expect(passesThreshold(outlook, 3)).toBe(false);
    const rain = defaultRule("manager", "rain-skip"); // 10 mm
    expect(passesThreshold(rain, 9.9)).toBe(false);
    expect(passesThreshold(rain, 10)).toBe(true);
    expect(passesThreshold(defaultRule("manager", "field-trigger"), null)).toBe(true);
  });

  it("backs off 1, 2, 4 … minutes, capped at an hour", () => {
    expect([1, 2, 3, 4, 5, 6, 7, 8].map(backoffMinutes)).toEqual([1, 2, 4, 8, 16, 32, 60, 60]);
  });
});

import { describe, expect, it } from "vitest";
import {
  celsiusToFahrenheit,
  daysFromTo,
  formatArea,
  formatDepth,
  formatHours,
  formatInstant,
  formatLocalDate,
  formatTemperature,
  formatVolume,
  haToAcres,
  m3hToGpm,
  m3ToAcreFeet,
  mmToInches,
  relativeDay,
} from "@/lib/units";

describe("conversions", () => {
  it("an inch is 25.4 mm exactly", () => {
    // International yard and pound agreement (1959): 1 in = 25.4 mm exactly.
    expect(mmToInches(25.4)).toBe(1);
    expect(mmToInches(50.8)).toBe(2);
  });

  it("an acre is 0.40468564224 ha", () => {
    // 1959 agreement: 1 ac = 4,840 yd² × 0.9144² m²/yd² = 4,046.8564224 m².
    expect(haToAcres(0.40468564224)).toBeCloseTo(1, 12);
    expect(haToAcres(100)).toBeCloseTo(247.105, 3);
  });

  it("an acre-foot is about 1,233.48 m³", () => {
    // 43,560 ft³ × 0.028316846592 m³/ft³ = 1,233.48 m³ (definition of the acre-foot).
    expect(m3ToAcreFeet(1233.48)).toBe(1);
    // 1 ML = 1,000 m³ ≈ 0.8107 acre-feet (from the same definitions).
    expect(m3ToAcreFeet(1000)).toBeCloseTo(0.8107, 4);
  });

  it("water freezes at 32 °F and boils at 212 °F", () => {
    // Definition of the Fahrenheit scale against Celsius.
    expect(celsiusToFahrenheit(0)).toBe(32);
    expect(celsiusToFahrenheit(100)).toBe(212);
    expect(celsiusToFahrenheit(-40)).toBe(-40);
  });

  it("100 m³/h is about 440 US gallons per minute", () => {
    // 1 US gal = 3.785411784 L exactly (US customary definition): 100,000 L/h / 3.785411784 / 60.
    expect(m3hToGpm(100)).toBeCloseTo(440.29, 2);
  });
});

describe("formatting for the screen", () => {
  it("depths in mm or inches", () => {
    expect(formatDepth(25.4, "metric")).toBe("25 mm");
    expect(formatDepth(25.4, "imperial")).toBe("1.00 in");
    expect(formatDepth(12.34, "metric", 1)).toBe("12.3 mm");
    expect(formatDepth(null, "metric")).toBe("—");
    expect(formatDepth(-0.001, "metric")).toBe("0 mm");
  });

  it("areas in ha or ac", () => {
    expect(formatArea(40.468564224, "imperial")).toBe("100.0 ac");
    expect(formatArea(12.34, "metric")).toBe("12.3 ha");
  });

  it("volumes in m³, ML or acre-feet", () => {
    // 100 mm over 1 ha = 1,000 m³ = 1 ML (REFERENCES.md facts of practice; 1 mm on 1 ha = 10 m³).
    expect(formatVolume(1000, "metric")).toBe("1,000 m³");
    expect(formatVolume(25_000, "metric")).toBe("25.0 ML");
    expect(formatVolume(2466.96, "imperial")).toBe("2.00 ac-ft");
  });

  it("temperatures in °C or °F", () => {
    expect(formatTemperature(21.5, "metric")).toBe("21.5 °C");
    expect(formatTemperature(21.5, "imperial")).toBe("70.7 °F");
  });

  it("run times to the nearest five minutes", () => {
    expect(formatHours(7.5)).toBe("7 h 30 min");
    expect(formatHours(0.26)).toBe("15 min");
    expect(formatHours(12)).toBe("12 h");
    expect(formatHours(null)).toBe("—");
  });
});

describe("farm-local dates", () => {
  it("an ISO local date reads the same whatever the viewer's zone", () => {
    expect(formatLocalDate("2026-12-02")).toBe("Wed 2 Dec");
    expect(formatLocalDate("2026-12-02", "long")).toBe("Wed 2 Dec 2026");
  });

  it("an instant reads in the farm's time zone", () => {
    // Sydney is UTC+11 in December (daylight saving, common practice, no source).
    expect(formatInstant("2026-12-01T22:00:00Z", "Australia/Sydney")).toBe("2 Dec, 09:00");
    expect(formatInstant("2026-12-01T22:00:00Z", "America/Denver")).toBe("1 Dec, 15:00");
  });

  it("days between dates and their words", () => {
    expect(daysFromTo("2026-12-30", "2027-01-02")).toBe(3);
    expect(relativeDay("2026-12-03", "2026-12-02")).toBe("tomorrow");
    expect(relativeDay("2026-12-02", "2026-12-02")).toBe("today");
    expect(relativeDay("2026-12-06", "2026-12-02")).toBe("in 4 days");
    expect(relativeDay("2026-11-30", "2026-12-02")).toBe("2 days ago");
  });
});

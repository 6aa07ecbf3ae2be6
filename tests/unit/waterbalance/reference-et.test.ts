import { describe, expect, it } from "vitest";
import {
  atmosphericPressureKPa,
  clearSkySolarMJm2,
  daylightHours,
  degMinToDecimal,
  extraterrestrialRadiationMJm2,
  hargreavesEtoMm,
  kmhToMs,
  meanSaturationVapourPressureKPa,
  monthlySoilHeatFluxMJm2,
  netLongwaveMJm2,
  psychrometricConstantKPaC,
  referenceEtDaily,
  saturationVapourPressureKPa,
  solarFromSunshineMJm2,
  solarFromTemperatureRangeMJm2,
  solarGeometry,
  vapourPressureFromRhMaxKPa,
  vapourPressureFromRhMaxMinKPa,
  vapourPressureFromRhMeanKPa,
  WaterBalanceInputError,
  windAt2mMs,
  type DailyWeather,
  type StationSite,
} from "@/lib/waterbalance";

/** |actual − expected| within half a unit of the last printed digit. */
function printed(actual: number, expected: number, decimals: number): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(0.5 * 10 ** -decimals + 1e-12);
}

describe("FAO-56 chapter 3 worked examples", () => {
  it("Example 2: pressure and γ at 1800 m", () => {
    const p = atmosphericPressureKPa(1800);
    printed(p, 81.8, 1); // FAO-56 Example 2
    printed(psychrometricConstantKPaC(p), 0.054, 3); // FAO-56 Example 2
  });

  it("Example 3: saturation vapour pressure for Tmax 24.5, Tmin 15 °C", () => {
    printed(saturationVapourPressureKPa(24.5), 3.075, 3); // FAO-56 Example 3
    printed(saturationVapourPressureKPa(15), 1.705, 3); // FAO-56 Example 3
    printed(meanSaturationVapourPressureKPa(24.5, 15), 2.39, 2); // FAO-56 Example 3
  });

  it("Example 5: actual vapour pressure from RH", () => {
    printed(vapourPressureFromRhMaxMinKPa(25, 18, 82, 54), 1.7, 2); // FAO-56 Example 5, eq. 17
    printed(vapourPressureFromRhMaxKPa(18, 82), 1.69, 2); // FAO-56 Example 5, eq. 18 (recomputed: 2.064 × 0.82)
    printed(vapourPressureFromRhMeanKPa(25, 18, 68), 1.78, 2); // FAO-56 Example 5, eq. 19 (recomputed: 0.68 × 2.616)
  });

  it("Examples 8 and 9: Ra and N at 20°S on 3 September", () => {
    const g = solarGeometry(-20, 246);
    printed(g.dr, 0.985, 3); // FAO-56 Example 8
    printed(g.declinationRad, 0.12, 2); // FAO-56 Example 8
    printed(g.sunsetHourAngleRad, 1.527, 3); // FAO-56 Example 8
    printed(extraterrestrialRadiationMJm2(-20, 246), 32.2, 1); // FAO-56 Example 8
    printed(daylightHours(-20, 246), 11.7, 1); // FAO-56 Example 9
  });

  it("Example 10: Rs from 220 h of sunshine in May at Rio de Janeiro", () => {
    const lat = -degMinToDecimal(22, 54);
    const ra = extraterrestrialRadiationMJm2(lat, 135);
    const n = daylightHours(lat, 135);
    printed(ra, 25.1, 1); // FAO-56 Example 10
    printed(n, 10.9, 1); // FAO-56 Example 10
    printed(solarFromSunshineMJm2(220 / 31, n, ra), 14.5, 1); // FAO-56 Example 10
  });

  it("Examples 11 and 12: Rso, Rnl and Rn at Rio de Janeiro in May", () => {
    printed(clearSkySolarMJm2(25.1, 0), 18.8, 1); // FAO-56 Example 11 (sea level, eq. 37)
    const rnl = netLongwaveMJm2(25.1, 19.1, 2.1, 14.5, 18.8);
    printed(rnl, 3.5, 1); // FAO-56 Example 12
    // FAO-56 Example 12 prints Rn = 7.7; recomputed from eq. 38-40 it is 11.17 − 3.53 = 7.6
    printed(0.77 * 14.5 - rnl, 7.6, 1);
  });

  it("Example 13: monthly soil heat flux in April from March 14.1 and May 18.8 °C", () => {
    printed(monthlySoilHeatFluxMJm2(14.1, 16.1, 18.8), 0.33, 2); // FAO-56 Example 13, eq. 43
  });

  it("Example 14: wind of 3.2 m/s at 10 m is 2.4 m/s at 2 m", () => {
    printed(windAt2mMs(3.2, 10), 2.4, 1); // FAO-56 Example 14, eq. 47
  });

  it("Rs from the temperature range: Lyon, July", () => {
    // FAO-56 chapter 3 example (Lyon, 45°43'N, Tmax 26.6, Tmin 14.8, Ra 40.6) — from memory
    printed(extraterrestrialRadiationMJm2(degMinToDecimal(45, 43), 196), 40.6, 1);
    printed(solarFromTemperatureRangeMJm2(26.6, 14.8, 40.6), 22.3, 1);
    // coastal kRs 0.19 (FAO-56 eq. 50), recomputed: 0.19 × √11.8 × 40.6
    printed(solarFromTemperatureRangeMJm2(26.6, 14.8, 40.6, { coastal: true }), 26.5, 1);
  });
});

describe("FAO-56 Example 18: daily ETo at Uccle (Brussels) on 6 July", () => {
  const site: StationSite = { latitudeDeg: degMinToDecimal(50, 48), elevationM: 100, windHeightM: 10 };
  const day: DailyWeather = {
    date: "2026-07-06",
    tMaxC: 21.5,
    tMinC: 12.3,
    rhMaxPct: 84,
    rhMinPct: 63,
    windMs: kmhToMs(10),
    sunshineHours: 9.25,
  };
  const r = referenceEtDaily(day, site);

  it("uses Penman-Monteith with nothing estimated", () => {
    expect(r.method).toBe("penman-monteith");
    expect(r.estimated).toEqual([]);
    expect(r.sources).toEqual({ solar: "sunshine", humidity: "rh-max-min", wind: "measured" });
  });

  it("reproduces every printed intermediate", () => {
    if (r.method !== "penman-monteith") throw new Error("expected Penman-Monteith");
    const t = r.terms;
    expect(t.doy).toBe(187); // FAO-56 Example 18
    printed(t.tMeanC, 16.9, 1); // FAO-56 Example 18
    printed(t.deltaKPaC, 0.122, 3); // FAO-56 Example 18
    printed(t.pressureKPa, 100.1, 1); // FAO-56 Example 18
    printed(t.gammaKPaC, 0.0666, 4); // FAO-56 Example 18
    printed(t.u2Ms, 2.078, 3); // FAO-56 Example 18
    printed(t.eSatTMaxKPa, 2.564, 3); // FAO-56 Example 18
    printed(t.eSatTMinKPa, 1.431, 3); // FAO-56 Example 18
    printed(t.esKPa, 1.997, 3); // FAO-56 Example 18
    printed(t.eaKPa, 1.409, 3); // FAO-56 Example 18
    printed(t.vpdKPa, 0.589, 3); // FAO-56 Example 18
    printed(t.dr, 0.967, 3); // FAO-56 Example 18
    printed(t.raMJm2, 41.09, 2); // FAO-56 Example 18
    printed(t.daylightHours, 16.1, 1); // FAO-56 Example 18
    printed(t.rsMJm2, 22.07, 2); // FAO-56 Example 18
    printed(t.rsoMJm2, 30.9, 2); // FAO-56 Example 18
    // FAO-56 Example 18 prints Rns 16.99 = 0.77 × the rounded 22.07; unrounded Rs gives 17.00
    expect(Math.abs(t.rnsMJm2 - 16.99)).toBeLessThanOrEqual(0.01);
    printed(t.rnlMJm2, 3.71, 2); // FAO-56 Example 18
    printed(t.rnMJm2, 13.28, 2); // FAO-56 Example 18
    expect(t.gMJm2).toBe(0); // FAO-56 eq. 42, daily G ≈ 0
  });

  it("gives ETo 3.88 mm/day", () => {
    printed(r.etoMm, 3.88, 2); // FAO-56 Example 18
  });
});

describe("FAO-56 Example 17: monthly ETo at Bangkok in April", () => {
  // Inputs and printed results from memory: 13°44'N, 2 m, Tmax 34.8, Tmin 25.6, ea 2.85 kPa, u2 2 m/s,
  // n 8.5 h, mean T March 29.2 / April 30.2 °C (G by eq. 44) -> ETo 5.72 mm/day
  it("reproduces the printed terms and ETo", () => {
    const r = referenceEtDaily(
      {
        date: "2026-04-15",
        tMaxC: 34.8,
        tMinC: 25.6,
        eaKPa: 2.85,
        windMs: 2,
        sunshineHours: 8.5,
        soilHeatFluxMJm2: monthlySoilHeatFluxMJm2(29.2, 30.2),
      },
      { latitudeDeg: degMinToDecimal(13, 44), elevationM: 2 },
    );
    if (r.method !== "penman-monteith") throw new Error("expected Penman-Monteith");
    printed(r.terms.raMJm2, 38.06, 2); // FAO-56 Example 17, from memory
    printed(r.terms.rsMJm2, 22.65, 2); // FAO-56 Example 17, from memory
    printed(r.terms.rnMJm2, 14.33, 2); // FAO-56 Example 17, from memory
    printed(r.etoMm, 5.72, 2); // FAO-56 Example 17, from memory
  });
});

describe("missing data (FAO-56 chapter 3)", () => {
  const site: StationSite = { latitudeDeg: degMinToDecimal(50, 48), elevationM: 100 };
  const full: DailyWeather = {
    date: "2026-07-06",
    tMaxC: 21.5,
    tMinC: 12.3,
    rhMaxPct: 84,
    rhMinPct: 63,
    windMs: 2.078,
    solarMJm2: 22.07,
  };

  it("estimates ea from Tmin when humidity is missing and says so", () => {
    const r = referenceEtDaily({ ...full, rhMaxPct: undefined, rhMinPct: undefined }, site);
    expect(r.estimated).toEqual(["humidity"]);
    if (r.method !== "penman-monteith") throw new Error("expected Penman-Monteith");
    printed(r.terms.eaKPa, saturationVapourPressureKPa(12.3), 9); // FAO-56 eq. 48, Tdew ≈ Tmin
    expect(r.sources.humidity).toBe("tmin");
  });

  it("takes 2 m/s when wind is missing", () => {
    const r = referenceEtDaily({ ...full, windMs: undefined }, site);
    expect(r.estimated).toEqual(["wind"]);
    if (r.method !== "penman-monteith") throw new Error("expected Penman-Monteith");
    expect(r.terms.u2Ms).toBe(2); // FAO-56 chapter 3: 2 m/s as a temporary estimate
  });

  it("estimates Rs from the temperature range when radiation and sunshine are missing", () => {
    const r = referenceEtDaily({ ...full, solarMJm2: undefined }, { ...site, coastal: false });
    expect(r.estimated).toEqual(["solar"]);
    if (r.method !== "penman-monteith") throw new Error("expected Penman-Monteith");
    printed(r.terms.rsMJm2, 0.16 * Math.sqrt(9.2) * r.terms.raMJm2, 9); // FAO-56 eq. 50, interior kRs 0.16
  });

  it("uses Hargreaves when only temperatures exist", () => {
    const r = referenceEtDaily({ date: "2026-07-06", tMaxC: 21.5, tMinC: 12.3 }, site);
    expect(r.method).toBe("hargreaves");
    expect(r.estimated).toEqual(["solar", "humidity", "wind"]);
    // FAO-56 eq. 52 recomputed by hand: 0.0023 × 34.7 × √9.2 × 0.408 × 41.09 = 4.06
    printed(r.etoMm, 4.06, 2);
    printed(hargreavesEtoMm(21.5, 12.3, 41.09), 4.06, 2);
  });

  it("can run Penman-Monteith with every estimate instead of Hargreaves", () => {
    const r = referenceEtDaily({ date: "2026-07-06", tMaxC: 21.5, tMinC: 12.3 }, site, {
      temperatureOnly: "penman-monteith",
    });
    expect(r.method).toBe("penman-monteith");
    expect(r.estimated).toEqual(["solar", "humidity", "wind"]);
  });
});

describe("impossible input is a clear error", () => {
  const site: StationSite = { latitudeDeg: 10, elevationM: 0 };
  const ok: DailyWeather = { date: "2026-01-10", tMaxC: 30, tMinC: 20 };
  it.each([
    ["Tmax below Tmin", { ...ok, tMaxC: 19 }, site, "tMaxC"],
    ["RH above 100", { ...ok, rhMaxPct: 101 }, site, "rhMaxPct"],
    ["RH below 0", { ...ok, rhMinPct: -1 }, site, "rhMinPct"],
    ["latitude beyond 90", ok, { ...site, latitudeDeg: 91 }, "latitudeDeg"],
    ["latitude beyond −90", ok, { ...site, latitudeDeg: -90.5 }, "latitudeDeg"],
    ["negative wind", { ...ok, windMs: -1 }, site, "windMs"],
    ["not a date", { ...ok, date: "2026-02-30" }, site, "date"],
  ])("%s", (_name, day, s, field) => {
    try {
      referenceEtDaily(day as DailyWeather, s as StationSite);
      throw new Error("no error");
    } catch (e) {
      expect(e).toBeInstanceOf(WaterBalanceInputError);
      expect((e as WaterBalanceInputError).field).toBe(field);
      expect((e as Error).message).toMatch(field);
    }
  });
});

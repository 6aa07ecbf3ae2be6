/**
 * Schema v1 against a real PostgreSQL: every migration rolls back and applies again, and the constraints
 * refuse values that cannot happen in a field.
 */
import { randomUUID } from "node:crypto";
import knexFactory, { type Knex } from "knex";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import config from "../../knexfile";

let knex: Knex;

beforeAll(() => {
  knex = knexFactory(config);
});

afterAll(async () => {
  await knex.destroy();
});

/** Inserts one row and returns its generated id. */
async function insertId(table: string, row: Record<string, unknown>): Promise<string> {
  const [created] = await knex(table).insert(row).returning<{ id: string }[]>("id");
  if (!created) throw new Error(`no row inserted into ${table}`);
  return created.id;
}

/** The rejection a constraint gives: SQLSTATE 23514 for a CHECK, 23505 for a unique index. */
function violates(constraint: string, code: "23514" | "23505" = "23514") {
  return { code, constraint };
}

describe("migrations", () => {
  it("roll back completely and apply again", async () => {
    await knex.migrate.rollback(undefined, true);
    expect(await knex.schema.hasTable("users")).toBe(false);
    expect(await knex.schema.hasTable("account_days")).toBe(false);
    const { rows } = await knex.raw<{ rows: { n: number }[] }>(
      "select count(*)::int as n from pg_proc where proname like 'rootbank\\_%'",
    );
    expect(rows[0]?.n).toBe(0);

    await knex.migrate.latest();
    const [, pending] = (await knex.migrate.list()) as [unknown[], unknown[]];
    expect(pending).toHaveLength(0);
    for (const table of [
      "users",
      "farms",
      "memberships",
      "invitations",
      "password_resets",
      "rate_limits",
      "audit_log",
      "soils",
      "crops",
      "irrigation_systems",
      "fields",
      "plantings",
      "gauges",
      "rain_readings",
      "rain_records",
      "weather_stations",
      "weather_days",
      "irrigation_events",
      "soil_checks",
      "account_days",
    ]) {
      expect(await knex.schema.hasTable(table), table).toBe(true);
    }
  });
});

describe("constraints", () => {
  const tag = randomUUID().slice(0, 8);
  let userId: string;
  let farmId: string;
  let soilId: string;
  let cropId: string;
  let gaugeId: string;
  let stationId: string;
  let fieldId: string;

  beforeAll(async () => {
    userId = await insertId("users", { email: `schema-${tag}@test.rootbank.example`, name: "Schema Test" });
    farmId = await insertId("farms", {
      name: `Schema ${tag}`,
      time_zone: "Australia/Sydney",
      created_by: userId,
    });
    soilId = await insertId("soils", {
      farm_id: farmId,
      name: "Loam",
      texture: "loam",
      theta_fc: 0.25,
      theta_wp: 0.12,
      theta_sat: 0.46,
    });
    cropId = await insertId("crops", {
      farm_id: farmId,
      name: "Maize",
      kc_ini: 0.3,
      kc_mid: 1.2,
      kc_end: 0.35,
      stage_ini_days: 30,
      stage_dev_days: 40,
      stage_mid_days: 50,
      stage_late_days: 30,
      root_min_m: 0.15,
      root_max_m: 1.3,
      p: 0.55,
    });
    gaugeId = await insertId("gauges", { farm_id: farmId, name: "Shed", kind: "manual" });
    stationId = await insertId("weather_stations", { farm_id: farmId, name: "AWS" });
    fieldId = await insertId("fields", { farm_id: farmId, name: "North", area_ha: 20, soil_id: soilId });
  });

  afterAll(async () => {
    await knex("farms").where({ id: farmId }).delete();
    await knex("users").where({ id: userId }).delete();
  });

  it("refuses impossible rain", async () => {
    // 1 200 mm in a day is beyond any farm gauge (the world record, La Réunion 1966, is about 1 825 mm).
    await expect(
      knex("rain_readings").insert({
        gauge_id: gaugeId,
        read_at: "2026-11-02T22:00:00Z",
        rain_date: "2026-11-02",
        depth_mm: 1200,
      }),
    ).rejects.toMatchObject(violates("rain_readings_depth_check"));
    // Rain cannot be negative: a gauge collects water, it never gives any back.
    await expect(
      knex("rain_readings").insert({
        gauge_id: gaugeId,
        read_at: "2026-11-02T22:00:00Z",
        rain_date: "2026-11-02",
        depth_mm: -1,
      }),
    ).rejects.toMatchObject(violates("rain_readings_depth_check"));
    // A time-stamped record of zero depth is no rain at all, so it is not a record.
    await expect(
      knex("rain_records").insert({ gauge_id: gaugeId, at: "2026-11-02T05:00:00Z", depth_mm: 0 }),
    ).rejects.toMatchObject(violates("rain_records_depth_check"));
    // Daily station rain obeys the same physical ceiling as a gauge reading.
    await expect(
      knex("weather_days").insert({
        station_id: stationId,
        date: "2026-11-02",
        kind: "observed",
        rain_mm: 1200,
      }),
    ).rejects.toMatchObject(violates("weather_days_rain_check"));
  });

  it("keeps one reading per gauge and rain day", async () => {
    const reading = {
      gauge_id: gaugeId,
      read_at: "2026-11-03T22:00:00Z",
      rain_date: "2026-11-03",
      depth_mm: 4.2,
    };
    await knex("rain_readings").insert(reading);
    // A gauge is emptied once per rain day, so a second total for the same day would count the rain twice.
    await expect(knex("rain_readings").insert({ ...reading, depth_mm: 5 })).rejects.toMatchObject(
      violates("rain_readings_gauge_day_unique", "23505"),
    );
    // Two tips of the same gauge at the same instant are one tip recorded twice.
    const tip = { gauge_id: gaugeId, at: "2026-11-03T05:00:00Z", depth_mm: 0.2 };
    await knex("rain_records").insert(tip);
    await expect(knex("rain_records").insert(tip)).rejects.toMatchObject(
      violates("rain_records_gauge_at_unique", "23505"),
    );
  });

  it("refuses soils whose water contents are out of order", async () => {
    const soil = { farm_id: farmId, texture: "clay", theta_sat: 0.47 };
    // Wilting point is drier than field capacity, or the soil would hold no plant-available water.
    await expect(
      knex("soils").insert({ ...soil, name: "wp = fc", theta_fc: 0.3, theta_wp: 0.3 }),
    ).rejects.toMatchObject(violates("soils_theta_check"));
    await expect(
      knex("soils").insert({ ...soil, name: "wp > fc", theta_fc: 0.2, theta_wp: 0.3 }),
    ).rejects.toMatchObject(violates("soils_theta_check"));
    // Field capacity is below saturation: drained soil holds less than soil with every pore full.
    await expect(
      knex("soils").insert({ ...soil, name: "fc > sat", theta_fc: 0.5, theta_wp: 0.2, theta_sat: 0.45 }),
    ).rejects.toMatchObject(violates("soils_theta_check"));
    // A texture the engine has no published values for would leave the soil without defaults.
    await expect(
      knex("soils").insert({
        ...soil,
        name: "mystery",
        texture: "moon dust",
        theta_fc: 0.36,
        theta_wp: 0.22,
      }),
    ).rejects.toMatchObject(violates("soils_texture_check"));
    // The effective porosity is part of the total porosity (Rawls et al. 1983 Green-Ampt parameters).
    await expect(
      knex("soils").insert({
        ...soil,
        name: "effective > total",
        theta_fc: 0.36,
        theta_wp: 0.22,
        ga_porosity: 0.4,
        ga_effective_porosity: 0.45,
      }),
    ).rejects.toMatchObject(violates("soils_ga_porosity_check"));
  });

  it("refuses impossible weather", async () => {
    const day = { station_id: stationId, kind: "observed" };
    // Relative humidity is a percentage of saturation: air cannot hold 120 % of what it can hold.
    await expect(
      knex("weather_days").insert({ ...day, date: "2026-11-04", rh_max_pct: 120 }),
    ).rejects.toMatchObject(violates("weather_days_humidity_check"));
    // The day's maximum temperature is at least its minimum.
    await expect(
      knex("weather_days").insert({ ...day, date: "2026-11-04", tmax_c: 10, tmin_c: 12 }),
    ).rejects.toMatchObject(violates("weather_days_temperature_check"));
    // Wind speed is a magnitude, never negative.
    await expect(
      knex("weather_days").insert({ ...day, date: "2026-11-04", wind_ms: -0.5 }),
    ).rejects.toMatchObject(violates("weather_days_wind_check"));
    // Radiation reaching the ground is never negative.
    await expect(
      knex("weather_days").insert({ ...day, date: "2026-11-04", solar_mj_m2: -1 }),
    ).rejects.toMatchObject(violates("weather_days_solar_check"));
    // Missing values are allowed: FAO-56 ch. 3 estimates them.
    await knex("weather_days").insert({ ...day, date: "2026-11-04", tmax_c: 30, tmin_c: 14 });
  });

  it("refuses unknown roles", async () => {
    // Access is granted by the five roles of DESIGN.md only; any other word would grant nothing or anything.
    await expect(
      knex("memberships").insert({ user_id: userId, farm_id: farmId, role: "admin" }),
    ).rejects.toMatchObject(violates("memberships_role_check"));
    // An invitation hands out a role on acceptance, so it carries the same five.
    await expect(
      knex("invitations").insert({
        farm_id: farmId,
        email: `invitee-${tag}@test.rootbank.example`,
        role: "superuser",
        token_hash: `hash-${tag}`,
        expires_at: "2030-01-01T00:00:00Z",
      }),
    ).rejects.toMatchObject(violates("invitations_role_check"));
    await knex("memberships").insert({ user_id: userId, farm_id: farmId, role: "owner" });
  });

  it("refuses other impossible values", async () => {
    // E-mail addresses are compared case-insensitively, so they are stored lower-case.
    await expect(
      knex("users").insert({ email: `Upper-${tag}@Test.Rootbank.Example`, name: "Upper" }),
    ).rejects.toMatchObject(violates("users_email_check"));
    // Local days are the account's unit, so the farm's zone must be one PostgreSQL can convert with.
    await expect(
      knex("farms").insert({ name: "Nowhere", time_zone: "Mars/Olympus_Mons" }),
    ).rejects.toMatchObject(violates("farms_time_zone_check"));
    // A rain day starts at an hour of the day.
    await expect(
      knex("farms").insert({ name: "Late", time_zone: "Australia/Sydney", rain_day_boundary_hour: 24 }),
    ).rejects.toMatchObject(violates("farms_rain_day_boundary_check"));
    // No system delivers more water to the root zone than it pumps.
    await expect(
      knex("irrigation_systems").insert({
        farm_id: farmId,
        name: "Magic",
        kind: "drip",
        application_efficiency: 1.2,
      }),
    ).rejects.toMatchObject(violates("irrigation_systems_efficiency_check"));
    // A field has some area.
    await expect(knex("fields").insert({ farm_id: farmId, name: "Empty", area_ha: 0 })).rejects.toMatchObject(
      violates("fields_area_check"),
    );
    // Roots only grow, so the starting depth is not below the final one.
    await expect(
      knex("plantings").insert({
        field_id: fieldId,
        season: "2026-27",
        crop_id: cropId,
        planting_date: "2026-10-01",
        root_min_m: 1.2,
        root_max_m: 0.8,
      }),
    ).rejects.toMatchObject(violates("plantings_root_check"));
    // A crop is not harvested before it is sown.
    await expect(
      knex("plantings").insert({
        field_id: fieldId,
        season: "2026-27",
        crop_id: cropId,
        planting_date: "2026-10-01",
        end_date: "2026-09-30",
      }),
    ).rejects.toMatchObject(violates("plantings_dates_check"));
    // FAO-56 p is a share of TAW and Table 22 stays within 0.05-0.95.
    await expect(knex("crops").where({ id: cropId }).update({ p: 1.2 })).rejects.toMatchObject(
      violates("crops_p_check"),
    );
    // 600 mm at once would flood a bay several times over.
    await expect(
      knex("irrigation_events").insert({
        field_id: fieldId,
        started_at: "2026-11-05T20:00:00Z",
        date: "2026-11-06",
        gross_depth_mm: 600,
        method: "depth",
      }),
    ).rejects.toMatchObject(violates("irrigation_events_depth_check"));
    // A set logged by volume must say the volume.
    await expect(
      knex("irrigation_events").insert({
        field_id: fieldId,
        started_at: "2026-11-05T20:00:00Z",
        date: "2026-11-06",
        gross_depth_mm: 30,
        method: "volume",
      }),
    ).rejects.toMatchObject(violates("irrigation_events_method_inputs_check"));
    // Depletion is water missing below field capacity, never negative.
    await expect(
      knex("soil_checks").insert({
        field_id: fieldId,
        date: "2026-11-06",
        depletion_mm: -5,
        method: "probe",
      }),
    ).rejects.toMatchObject(violates("soil_checks_depletion_check"));
  });

  it("keeps field names unique among live fields, not archived ones", async () => {
    await expect(knex("fields").insert({ farm_id: farmId, name: "North", area_ha: 5 })).rejects.toMatchObject(
      violates("fields_farm_name_unique", "23505"),
    );
    await knex("fields").where({ id: fieldId }).update({ archived_at: knex.fn.now() });
    await knex("fields").insert({ farm_id: farmId, name: "North", area_ha: 5 });
  });

  it("recognises a repeated offline submission by its client id", async () => {
    const id = randomUUID();
    const event = {
      id,
      field_id: fieldId,
      started_at: "2026-11-06T20:00:00Z",
      date: "2026-11-07",
      gross_depth_mm: 25,
      method: "depth",
      created_by: userId,
    };
    await knex("irrigation_events").insert(event).onConflict("id").ignore();
    await knex("irrigation_events").insert(event).onConflict("id").ignore();
    const rows = await knex("irrigation_events")
      .where({ id })
      .count<{ count: string | number }[]>({ count: "*" });
    expect(Number(rows[0]?.count)).toBe(1);
  });

  it("stamps updated_at on update", async () => {
    const before = await knex("gauges").where({ id: gaugeId }).first("updated_at");
    await knex("gauges").where({ id: gaugeId }).update({ name: "Shed gauge" });
    const after = await knex("gauges").where({ id: gaugeId }).first("updated_at");
    expect(new Date(after.updated_at).getTime()).toBeGreaterThan(new Date(before.updated_at).getTime());
  });

  it("removes a farm's records with the farm, and keeps a person's records when the person goes", async () => {
    const other = await insertId("users", { email: `leaver-${tag}@test.rootbank.example`, name: "Leaver" });
    const reading = await insertId("rain_readings", {
      gauge_id: gaugeId,
      read_at: "2026-11-08T22:00:00Z",
      rain_date: "2026-11-08",
      depth_mm: 1.4,
      created_by: other,
    });
    await knex("users").where({ id: other }).delete();
    expect(await knex("rain_readings").where({ id: reading }).first("created_by")).toEqual({
      created_by: null,
    });

    const doomed = await insertId("farms", { name: `Doomed ${tag}`, time_zone: "UTC" });
    const soil = await insertId("soils", {
      farm_id: doomed,
      name: "Clay",
      texture: "clay",
      theta_fc: 0.36,
      theta_wp: 0.22,
      theta_sat: 0.47,
    });
    await knex("fields").insert({ farm_id: doomed, name: "Only", area_ha: 3, soil_id: soil });
    await knex("farms").where({ id: doomed }).delete();
    expect(await knex("fields").where({ farm_id: doomed }).first()).toBeUndefined();
    expect(await knex("soils").where({ id: soil }).first()).toBeUndefined();
  });
});

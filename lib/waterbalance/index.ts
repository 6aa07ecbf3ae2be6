/**
 * Rootbank's water-balance engine: pure TypeScript, no I/O, nothing imported from app/, components/
 * or db/ (only date-fns' time-zone helper, for the reading-day rule).
 *
 * Conventions the data layer relies on:
 * - Units are in the names: mm, m, ha, m³, m/s, °C, %, kPa, MJ m⁻² (per day unless named per hour).
 * - Dates are ISO local dates ('2026-11-30'); time-stamped rain is UTC instants (ISO strings or epoch
 *   ms) with the farm's IANA time zone beside them. An account day runs from the farm's boundary hour
 *   (e.g. 09:00) to the next and is named by the date it starts on: a 09:00 reading on the 30th is the
 *   29th's rain ({@link accountDayOfInstant}, {@link accountDayOfManualReading},
 *   {@link groupRecordsByAccountDay}).
 * - Bad input throws {@link WaterBalanceInputError} (`code` 'WATERBALANCE_INVALID_INPUT', `field`).
 *
 * Main entry points:
 * - {@link runFieldAccount}(FieldAccountInput) → FieldAccountResult: one AccountDay per day with every
 *   term (etoMm, kc, etcMm, ks, etcAdjMm, rainMm, runoffMm, effectiveRainMm, irrigationGrossMm,
 *   irrigationNetMm, capillaryRiseMm, deepPercolationMm, depletionStartMm, depletionEndMm, tawMm,
 *   rawMm, triggerMm, pAdjusted, rootDepthM, soilCheckReset), its provenance and its closure check.
 * - {@link computeFieldSeason} / {@link balanceLoop}: the same in typed-array columns, for recomputes.
 * - {@link computeOutlook}: the account projected forward and the irrigation recommendation.
 * - {@link planFarm}: the farm's irrigations ordered by urgency within shared capacity.
 */

export { WaterBalanceInputError } from "./errors";
export * from "./units";
export { isoDateToDayNumber, dayNumberToIsoDate, addDaysIso, daysBetweenIso, dayOfYear } from "./dates";

// FAO-56 chapters 3-4: reference ET
export {
  atmosphericPressureKPa,
  psychrometricConstantKPaC,
  saturationVapourPressureKPa,
  saturationSlopeKPaC,
  meanSaturationVapourPressureKPa,
  vapourPressureFromDewpointKPa,
  vapourPressureFromRhMaxMinKPa,
  vapourPressureFromRhMaxKPa,
  vapourPressureFromRhMeanKPa,
  vapourPressureFromTminKPa,
  windAt2mMs,
} from "./meteo";
export {
  extraterrestrialRadiationMJm2,
  daylightHours,
  solarGeometry,
  inverseRelativeDistance,
  solarDeclinationRad,
  sunsetHourAngleRad,
  solarFromSunshineMJm2,
  solarFromTemperatureRangeMJm2,
  clearSkySolarMJm2,
  netShortwaveMJm2,
  netLongwaveMJm2,
  cloudinessFactor,
  monthlySoilHeatFluxMJm2,
} from "./solar";
export type { SolarGeometry } from "./solar";
export { referenceEtDaily, penmanMonteithEtoMm, validateDailyWeather } from "./reference-et";
export type {
  StationSite,
  DailyWeather,
  EstimatedInput,
  PenmanMonteithTerms,
  HargreavesTerms,
  DailyEtoResult,
  ReferenceEtOptions,
} from "./reference-et";
export { hargreavesEtoMm, fillDailyInputs, emptyFilledInputs } from "./missing-data";
export type { HumiditySource, SolarSource, WindSource, FilledInputs } from "./missing-data";
export {
  referenceEtHourly,
  extraterrestrialRadiationPeriodMJm2,
  solarTimeAngleRad,
  seasonalCorrectionHours,
} from "./reference-et-hourly";
export type { HourlyWeather, HourlySite, HourlyEtoResult } from "./reference-et-hourly";

// FAO-56 chapters 6-8: crop coefficients, root zone, stress
export {
  kcForDay,
  cropStageForDay,
  seasonLengthDays,
  adjustKcMidForClimate,
  adjustKcEndForClimate,
  rootDepthForDayM,
  adjustPForEtc,
  waterStressCoefficient,
} from "./crop-coefficient";
export type { StageLengths, CoefficientCurve, CropStage } from "./crop-coefficient";
export {
  kcMax,
  totalEvaporableWaterMm,
  evaporationReductionKr,
  canopyCoverFraction,
  exposedWettedFraction,
  evaporationCoefficient,
  surfaceLayerStep,
  WETTED_FRACTION_BY_WETTING,
} from "./dual-coefficient";
export type { SurfaceLayerDay } from "./dual-coefficient";
export { CROP_LIBRARY, findCrop } from "./crops";
export type { CropLibraryEntry } from "./crops";
export {
  SOIL_TEXTURES,
  findTexture,
  totalAvailableWaterMm,
  readilyAvailableWaterMm,
  resolveSoil,
} from "./soils";
export type { SoilTexture, TextureId, GreenAmptParams, SoilSpec, ResolvedSoil } from "./soils";

// Rain that counts
export {
  curveNumberRunoffMm,
  runoffFromRetentionMm,
  potentialRetentionMm,
  curveNumberForCondition,
  antecedentFromDepletion,
  curveNumberFor,
  slopeAdjustedCurveNumber,
  CURVE_NUMBER_TABLE,
} from "./runoff";
export type {
  AntecedentCondition,
  AntecedentFormula,
  AntecedentThresholds,
  CurveNumberOptions,
  HydrologicSoilGroup,
  RunoffCover,
} from "./runoff";
export {
  moistureDeficit,
  moistureDeficitFromDepletion,
  infiltrationCapacityMmH,
  pondedInfiltrationMm,
  pondingTimeH,
  greenAmptStorm,
  greenAmptColumns,
} from "./green-ampt";
export type { GreenAmptStormResult } from "./green-ampt";
export {
  toEpochMs,
  buildHyetograph,
  hyetographColumns,
  piecesToColumns,
  columnsToPieces,
  separateStorms,
  stormBounds,
  stormsFromRecords,
} from "./storms";
export type { RainRecord, HyetographPiece, HyetographColumns, Storm, HyetographOptions } from "./storms";
export {
  accountDayOfInstant,
  accountDayOfManualReading,
  accountDayOfReadingDate,
  groupRecordsByAccountDay,
  dailyTotalsFromRecords,
} from "./reading-day";
export { rainFromGauges, distanceKm } from "./gauge-weights";
export type {
  LatLon,
  GaugeReading,
  GaugeWeight,
  InterpolatedRain,
  GaugeWeightOptions,
} from "./gauge-weights";
export {
  unitKineticEnergyMJhaMm,
  stormEnergy,
  stormEnergyColumns,
  maxDepthInWindowMm,
  surfaceSealing,
} from "./rain-energy";
export type { KineticEnergyMethod, StormEnergy, SealingOptions } from "./rain-energy";
export {
  marshallPalmerLambdaPerMm,
  marshallPalmerDensity,
  marshallPalmerSummary,
  stokesFallSpeedMs,
  sphereFallSpeedMs,
  atlasFallSpeedMs,
  terminalFallSpeedMs,
  MARSHALL_PALMER_N0,
  MAX_RAINDROP_DIAMETER_MM,
  LARGEST_MEASURED_DROP_MM,
} from "./drops";
export type { DropSizeSummary } from "./drops";

// The daily balance
export {
  balanceLoop,
  createBalanceLoopOutput,
  RUNOFF_NONE,
  RUNOFF_CURVE_NUMBER,
  RUNOFF_STORM,
} from "./balance-loop";
export type { BalanceLoopInput, BalanceLoopOutput, LoopCurveNumber, LoopDual } from "./balance-loop";
export { runFieldAccount, computeFieldSeason, accountRows, CLOSURE_TOLERANCE_MM } from "./balance";
export type { FieldSeasonColumns } from "./balance";
export { etoForSpan, computeStationEto, prepareCropSeason, MAX_ACCOUNT_DAYS } from "./field-season";
export type { StationEtoSeries, PreparedCropSeason } from "./field-season";
export type * from "./account-types";

// Outlook and farm plan
export { computeOutlook, irrigationDepths } from "./outlook";
export type { OutlookInput, OutlookResult, OutlookDay, ApplicationRate } from "./outlook";
export { planFarm, planFieldFromOutlook } from "./farm-plan";
export type {
  CapacityGroup,
  PlanField,
  FarmPlanInput,
  FarmPlanResult,
  PlannedIrrigation,
  ShortfallDay,
} from "./farm-plan";

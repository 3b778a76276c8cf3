/**
 * Ebbline's decay engine: pure functions from recorded discharges to τ, capacitance, health,
 * discharge safety, trend and forecast, and life estimate. No I/O, no clock (pass `asOfOn`).
 *
 * The usual entry points:
 * - {@link judgeDecayRun}: samples + bank design + baseline + cabinet + conditions → the verdict.
 * - {@link bankEngineInputs}: a bank as the register keeps it → the design, baseline and cabinet
 *   that {@link judgeDecayRun} takes (the browser's check and the API use the same one).
 * - {@link fitDecay}: samples → τ with its interval (the fit alone, e.g. for a live preview).
 * - {@link forecastEndOfLife}: a bank's ratio history → end-of-life date, RUL, next visit.
 * - {@link estimateArrheniusLife} / {@link lifeUsed}: life from temperature.
 * - {@link parseDecaySamplesCsv} / {@link parseRatioHistoryCsv}: loose CSV text (or a logger
 *   file's bytes) → data.
 */

export * from './errors';
export { validateDecaySamples, fitDecay } from './decay-fit';
export type {
  DecaySample,
  DecayFitOptions,
  DecayFit,
  DecayFitResult,
  ExcludedReading,
  ControlSupplyPhase,
  DecayResidual,
  DecayNoise,
} from './decay-fit';
export {
  readingResolutionVolts,
  noiseFloor,
  noiseVariances,
  estimateNoiseModel,
} from './noise-model';
export type { ReadingNoiseInput, NoiseModel } from './noise-model';
export { fitLogLinear, refineExponential } from './exponential-least-squares';
export type {
  ExponentialParameters,
  ExponentialFit,
  LogLinearWeighting,
} from './exponential-least-squares';
export {
  controlSupplyDecayVolts,
  controlSupplyKneeSeconds,
  estimateControlSupplyWatts,
  findControlSupplyKnee,
  fitControlSupplyPhase,
} from './control-supply';
export type { ControlSupplyDecay, ControlSupplyPhaseFit } from './control-supply';
export { findTypingSlip, isOnCurve, OFF_CURVE_Z } from './outliers';
export type { ExclusionCode, TypingSlip, ResidualScales } from './outliers';
export {
  effectiveDischargeOhms,
  resolveMeterInputOhms,
  capacitanceFromTauMicrofarads,
  tauSecondsOf,
  bankCapacitanceMicrofarads,
  bleederOhmsFromBalancingResistors,
  normaliseCapacitanceTo20C,
} from './capacitance';
export type {
  BankConstruction,
  CapacitanceTemperatureModel,
  NormalisedCapacitance,
} from './capacitance';
export {
  classifyHealth,
  isPlausibleRatio,
  PLAUSIBLE_RATIO,
  resolveHealthLimits,
  worseHealth,
} from './health-rules';
export { nextStepAfterVerdict } from './next-step';
export type { NextStep, NextStepFacts, NextStepKind } from './next-step';
export { formatFigure, formatInterval, formatPercentFigure, formatDateOn } from './format';
export { judgeDecayRun } from './verdict';
export type {
  BankDesignFacts,
  BaselineFacts,
  CabinetFacts,
  RunConditions,
  DecayRunFacts,
  DecayVerdict,
  DecayVerdictResult,
  VerdictFinding,
  VerdictFindingCode,
} from './verdict';
export { judgeRecordedRun, runConditionsOf, visualFindingSentence } from './recorded-run';
export type {
  RecordedRunFacts,
  RecordedRunObservations,
  RecordedRunVerdict,
  RecordedRunOkVerdict,
  RecordedRunUnusableVerdict,
  ReadingsPrepared,
  ReadingSetAside,
} from './recorded-run';
export { bankEngineInputs } from './bank-engine-inputs';
export type { BankEngineInputs, BankRecordForEngine, DesignRevisionFigures } from './bank-engine-inputs';
export { timeToVoltsSeconds, estimateDischargeSafety, iec60204Sentence } from './discharge-safety';
export type {
  SafeAfterSeconds,
  DischargeSafetyInput,
  DischargeSafetyEstimate,
} from './discharge-safety';
export { forecastEndOfLife } from './trend-forecast';
export type {
  RatioHistoryPoint,
  TrendModelName,
  TrendModelFit,
  EndOfLifeForecastInput,
  EndOfLifeForecast,
} from './trend-forecast';
export { estimateArrheniusLife, lifeUsed, HOURS_PER_YEAR } from './life-estimate';
export type { ArrheniusLifeInput, ArrheniusLifeEstimate, LifeUsed } from './life-estimate';
export {
  dayNumberFromIsoDate,
  isoDateFromDayNumber,
  addDays,
  daysBetween,
  DAYS_PER_YEAR,
} from './calendar-dates';
export { parseDecaySamplesCsv } from './samples-csv';
export type { DecaySamplesCsv, DecaySamplesCsvOptions } from './samples-csv';
export type { ColumnSelector, LoggerColumnOptions } from './logger-columns';
export { decodeTextBytes } from './text-decoding';
export type { DecodedText, TextEncodingName } from './text-decoding';
export { parseRatioHistoryCsv } from './history-csv';
export type { RatioHistoryCsv } from './history-csv';
export { tQuantile, tCdf, normalQuantile } from './student-t';

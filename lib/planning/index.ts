export {
  planSchema,
  toPlanJson,
  trainSchemaV2,
  scaleSchema,
  clockSchema,
  rulesSchema,
  supplySchema,
  driverSchema,
  cabSchema,
  blockSchema,
  linkSchema,
  locomotiveSchema,
  trainSchema,
  operatorSchema,
  runSchema,
  stepSchema,
  blockEndSchema,
  BLOCK_ENDS,
  dropLineSchema,
  formatPlanIssues,
  formatIssuePath,
  PLAN_ID_PATTERN,
  PLAN_LIMITS,
} from './schema';
export type {
  Plan,
  PlanJson,
  Scale,
  FastClock,
  Rules,
  Supply,
  Driver,
  Cab,
  Block,
  Link,
  BlockEnd,
  Locomotive,
  Train,
  Operator,
  Run,
  Step,
} from './schema';
export { checkPlan, CheckBudgetError, FINDING_LIMITS } from './check';
export type { PlanCheck, CheckOptions } from './check';
export { FINDING_KINDS, compareFindings } from './finding';
export type { Finding, FindingKind } from './finding';
export { buildLoadProfile, runCurrents } from './load';
export type { LoadPoint, LoadSeries, LoadProfile, HeatPoint, HeatSeries } from './load';
export { nominalTrackVolts, trackVoltsOf, plannedSpeedKmh } from './voltage';
export { dropAt, channelWatts, driverDrop, surgeLimit, startAmps, trainAmps, scaleSpeedKmh } from './electrics';
export type { DropLine, DriverDrop } from './electrics';
export { suggestRetime, applyRetime } from './retime';
export type { Retime, RetimeOptions } from './retime';
export { timeRun, modelSpeedMmPerS } from './timing';
export type { TimeRunInput, TimedRun } from './timing';
export { defaultRamps, modelRateMmPerS2, Movement } from './motion';
export type { Ramps, RampDefault } from './motion';
export { findRoute, routeThrough, ROUTE_WAYPOINTS_CAP } from './route';
export type { TrackGraph, RouteStep, RouteResult } from './route';
export { travelOfRun, neededOutput, jointAgrees, linkEnds, otherEnd, checkJointParity, endAdjacency } from './track';
export type { End, Travel } from './track';
export { travelOfPlan } from './polarity';
export { trainPositionsAt } from './positions';
export type { PositionRun, TrainPosition } from './positions';
export { dutyFor, pwm8Of } from './duty';
export type { DutyInput, DutyResult } from './duty';
export { realToFast, fastToReal, fastTimeToReal, formatFast, formatTimeOfDay, formatSessionTime } from './clock';
export { parseTimeOfDay, DAY_S } from './time-of-day';
export { timeOfDaySchema } from './schema';
export type { TimeOfDayOptions } from './time-of-day';
export { readSessionClock, clockActionRefusal } from './session-clock';
export type { ClockRecord, ClockReading, ClockState, ClockActionName } from './session-clock';
export { propagateDelays } from './propagate';
export type { RunActuals, PropagateInput, PredictedRun, PredictedStatus, Propagation } from './propagate';
export { SCALES, findScale, gaugeForScale } from './scales';
export type { ScaleEntry } from './scales';
export { DRIVER_PRESETS, findDriverPreset, driverFromPreset } from './presets';
export type { DriverPreset } from './presets';
export { defaultRules, AMPS_TOLERANCE, VOLTS_TOLERANCE, TIME_TOLERANCE_S } from './rules';
export { indexPlan } from './plan-index';
export type { PlanIndex } from './plan-index';

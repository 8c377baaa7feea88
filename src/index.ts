/**
 * heliochron's public API: named re-exports only.
 * The command line (src/cli/) is a thin layer over these. Everything here runs unchanged in a
 * browser (no file access, no Node built-ins); src/node.ts adds the readers of files on disk.
 */

// Errors
export { HeliochronError, InvalidInputError, ConvergenceError, UnsupportedError, OutputError } from './errors.js';
export type { ErrorKind } from './errors.js';

// Angles
export { degToRad, radToDeg, normalizeDeg360, normalizeDeg180, angleDiffDeg } from './math/angles.js';

// Calendars
export {
  calendarDateToJd,
  jdToCalendarDate,
  isLeapYear,
  daysInMonth,
  dayOfYear,
  weekdayOfJd,
  ROME_FIRST_GREGORIAN_JD,
} from './calendar/julianDay.js';
export type { CalendarKind, CalendarDate } from './calendar/julianDay.js';
export {
  loadReformTable,
  findRegion,
  parseCalendarRule,
  calendarInForce,
  civilDateToJd,
  jdToCivilDate,
} from './calendar/regions.js';
export type { Region } from './calendar/regions.js';
export { historicalToJanuaryYear, januaryYearToHistorical, formatDualYear } from './calendar/yearStart.js';
export { easterSunday } from './calendar/easter.js';
export { parseDateText } from './calendar/parseDate.js';
export { formatCalendarDate, formatDualStyle } from './calendar/format.js';

// Time-keeping
export { deltaT } from './time/deltaT.js';
export { jdUTToJdTT, jdTTToJdUT } from './time/timeScales.js';
export { clockToJdUT, jdUTToClockMinutes, parseClockKind, formatClockKind } from './time/clock.js';

// Ephemeris
export { sunPosition } from './ephemeris/sunPosition.js';
export type { SunPosition, SunSite } from './ephemeris/sunPosition.js';
export { equationOfTimeMinutes } from './ephemeris/equationOfTime.js';
export { sunEvents } from './ephemeris/riseSet.js';
export { refractionDeg, bennettRefractionDeg, STANDARD_AIR } from './ephemeris/refraction.js';
export { fastSunPosition } from './ephemeris/fastSun.js';
export { moonPosition } from './ephemeris/moonPosition.js';
export type { MoonPosition } from './ephemeris/moonPosition.js';
export { moonEvents, moonAge, lunarPhaseNear } from './ephemeris/moonEvents.js';
export type { MoonEvents, LunarPhaseName, LunarPhaseInstant } from './ephemeris/moonEvents.js';
export { moonPhaseWords, litSideWords } from './ephemeris/moonLook.js';

// Shadow geometry
export { horizontalShadowAngleDeg, verticalShadowAngleDeg } from './geometry/shadowAngles.js';
export { predictEvidence, evidenceResiduals, evidenceLocus } from './geometry/observationModels.js';

// Measuring on the picture
export { fitHomography, applyHomography, invertHomography } from './image/homography.js';
export { measureScenePixels } from './image/measureScene.js';
export { resolvePixelObservations } from './image/resolvePixels.js';
export { solveCamera } from './image/camera.js';
export type { CameraSolution, VanishingPointReport } from './image/camera.js';
export type { CameraInput, LineFamily, ClickedLine, FamilyDirection } from './image/cameraModel.js';
export { sunFromShadowPairs, compareShadowSets } from './image/cameraSun.js';
export type { ShadowPairInput, SunFromShadows, SunComparison } from './image/cameraSun.js';
export { resolveSceneSun, describeSceneSun } from './image/sceneSun.js';
export { sceneAnnotations, annotationsText } from './report/annotations.js';
export type { AnnotationCollection, Annotation } from './report/annotations.js';

// Scene files
export { readSceneText } from './scene/readScene.js';
export type * from './scene/types.js';

// Solver
export { solveDates } from './solver/solveDates.js';
export { checkProposal } from './solver/checkDate.js';
export type * from './solver/types.js';

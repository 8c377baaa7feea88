/**
 * The result types of the date solver (src/solver/solveDates.ts) and of the
 * proposal check (src/solver/checkDate.ts).
 *
 * Plain readonly data: everything a report, chart or JSON export needs is a field
 * here; nothing has to be recomputed downstream. Units are in the names
 * (`Deg`, `Minutes`, `Days`); Julian Days name their scale (`jdUT`). Civil dates
 * carry their calendar. Times of day are minutes after the local midnight of the
 * clock in question, [0, 1440).
 *
 * Stability: other parts render these types; they change only by adding fields.
 */
import type { GroupTest } from './groupConsistency.js';
import type { CivilDay, ClockKind } from '../scene/types.js';

/** A civil date in a named calendar (structurally the same as CalendarDate of src/calendar/julianDay.ts). */
export interface SolverCalendarDate {
  readonly calendar: 'julian' | 'gregorian';
  readonly year: number; // astronomical numbering
  readonly month: number; // 1-12
  readonly day: number; // 1-31
}

/**
 * What a clock in the picture is assumed to have kept, for one set of candidates.
 * 'none': the scene has no clock reading (or the candidate set does not use one).
 */
export type ClockAssumption =
  | { readonly kind: 'none' }
  | (ClockKind & { readonly stated: boolean }); // stated: given in the scene (true) or tried because kept was 'unknown' (false)

/** One scalar residual of one measured observation at a candidate. */
export interface ResidualEntry {
  readonly observationId: string;
  readonly observationKind: string;
  /** Which measured number: 'slope', 'depth-ratio', 'width-ratio', 'shadow-azimuth', 'length-ratio', 'distance-ratio', 'azimuth', 'altitude', 'reading', 'east', 'north', ... */
  readonly component: string;
  /** The light of a shadow: 'moon' for a shadow cast by moonlight, 'sun' for sunlight; absent for clocks and the moon's own evidence. */
  readonly light?: 'sun' | 'moon';
  readonly measured: number;
  readonly predicted: number;
  /** Unit of measured and predicted: 'deg', 'ratio', 'min', 'm'. */
  readonly unit: string;
  readonly sigma: number;
  /** (measured - predicted) / sigma, wrapped where the quantity is periodic (angles, clock modulo 60, 360 or 720 min). */
  readonly normalised: number;
  /**
   * A clock on a 12- or 6-hour dial: the reading on the 24-hour count that fits, minutes [0, 1440), and
   * how many turns of the dial were added to what it shows (the dial cannot tell them apart).
   */
  readonly fullCount?: { readonly minutes: number; readonly turnsOfDial: number; readonly dialHours: 6 | 12 };
}

/** A fact without a number (wall lit or shaded, sun up) at a candidate. */
export interface FactEntry {
  readonly observationId: string;
  readonly observationKind: 'wall-lit' | 'wall-shaded' | 'sun-up' | 'sun-not-up' | 'rod-side' | 'fin-side' | 'pair-side' | 'wedge' | 'moon-up' | 'moon-not-up';
  /** 'moon' for a fact of a shadow cast by moonlight (then 'sun-up' says the moon is up); absent: the sun. */
  readonly light?: 'moon';
  readonly satisfied: boolean;
  /** Soft penalty added to the objective, 0 when satisfied; not counted in the degrees of freedom. */
  readonly penalty: number;
  /** Plain words: "the Tanners' Hall front is lit (sun 34 deg from its normal)". */
  readonly note: string;
}

/** Times of day of a candidate instant, each in its own clock. */
export interface CandidateTimes {
  readonly localApparentMinutes: number;
  readonly localMeanMinutes: number;
  readonly utMinutes: number;
  /** Civil day of the UT instant (can differ from the local civil day). */
  readonly utDate: SolverCalendarDate;
  /** Present when the scene names a zone or meridian clock (or it was tried). */
  readonly clock?: { readonly kind: ClockKind; readonly minutes: number; readonly label: string };
  readonly equationOfTimeMinutes: number;
  readonly deltaTSeconds: number;
}

/** One nuisance parameter (with a Gaussian prior) at the candidate: prior and fitted value. */
/**
 * The unit of a nuisance's values: degrees for a wall's azimuth and the site's latitude and
 * longitude; for a component of the camera's shared error, one sigma of that component
 * (prior 0, sigma 1), not an angle.
 */
export type NuisanceUnit = 'deg' | 'camera sigma';

export interface NuisanceEntry {
  /** 'wall:<id>:azimuth', 'site:latitude', 'site:longitude', 'camera:error-<k>'. */
  readonly name: string;
  /**
   * The unit of prior, fitted value and sigmas. The field names end in "Deg" for every entry (so that
   * readers of the JSON keep working); for the camera's components the unit is 'camera sigma'.
   */
  readonly unit: NuisanceUnit;
  readonly priorDeg: number;
  readonly priorSigmaDeg: number;
  readonly fittedDeg: number;
  /** Posterior one-sigma from the Gauss-Newton covariance. */
  readonly posteriorSigmaDeg: number;
}

/** One ellipse at one confidence level, in the (day, minute) plane. */
export interface DayMinuteEllipse {
  readonly probability: number; // e.g. 0.6827 or 0.95
  /** Delta chi-square that bounds it (2 parameters): 2.30 (68.3%), 5.991 (95%). */
  readonly deltaChiSquare: number;
  /** Half-widths of the bounding box: the projected interval on each axis, +/- days and +/- minutes. */
  readonly halfWidthDays: number;
  readonly halfWidthMinutes: number;
  /**
   * Semi-axes as vectors (days component, minutes component), major first, from the eigenvectors of
   * the covariance with 1 day and 1 minute as the units of the two axes.
   */
  readonly semiAxes: readonly [
    { readonly days: number; readonly minutes: number },
    { readonly days: number; readonly minutes: number },
  ];
  /** Angle of the major axis from the day axis toward the minute axis, degrees, in the 1 day : 1 minute plane, (-90, 90]. */
  readonly orientationDeg: number;
}

/** A sky ellipse, in (azimuth, altitude) degrees. */
export interface SkyEllipse {
  readonly probability: number;
  readonly deltaChiSquare: number;
  readonly semiMajorDeg: number;
  readonly semiMinorDeg: number;
  /** Angle of the major axis from the azimuth axis toward the altitude axis, degrees, (-90, 90]. */
  readonly orientationDeg: number;
}

/** Result of the profile-likelihood scan over the day (minimising over the minute and the nuisances). */
export interface ProfileScan {
  readonly probability: number; // 0.95
  readonly deltaChiSquare: number; // 3.841 (1 parameter of interest) for the day interval
  /** Days relative to the candidate's day (negative earlier), of the interval ends. */
  readonly fromDays: number;
  readonly toDays: number;
  readonly fromDate: SolverCalendarDate;
  readonly toDate: SolverCalendarDate;
  /** Range of local apparent minutes over the interval. */
  readonly fromLocalApparentMinutes: number;
  readonly toLocalApparentMinutes: number;
  /** True when the interval reached the scan limit (the day is unconstrained that far). */
  readonly open: boolean;
  /** The scanned points: day offset, best minute, chi-square. */
  readonly points: readonly { readonly days: number; readonly localApparentMinutes: number; readonly chiSquare: number }[];
}

/** The uncertainty of one candidate; `method` says which of the two forms holds. */
export interface CandidateUncertainty {
  /**
   * 'ellipse': the linearised covariance is valid; 'profile-scan': it is not and the scan gives the
   * interval; 'not-fixed': the evidence does not fix the day and the hour (no ellipse, no interval).
   */
  readonly method: 'ellipse' | 'profile-scan' | 'not-fixed';
  readonly ellipseValid: boolean;
  /** Plain words when invalid: "near the solstice the date is poorly constrained", "linearisation check failed ...". */
  readonly invalidReason?: string;
  /** Largest relative error of the quadratic chi-square prediction at points on the 95% ellipse. */
  readonly linearityCheck: number;
  /** Covariance of (days, minutes of local apparent time) with the nuisances marginalised. */
  readonly covariance: { readonly days2: number; readonly daysMinutes: number; readonly minutes2: number };
  readonly sigmaDays: number;
  readonly sigmaMinutes: number;
  readonly correlation: number;
  /** Minutes of local apparent time per day along the correlation (C_dm / C_dd): "each day later, the hour moves by this". */
  readonly minutesPerDay: number;
  /** 1-sigma (Delta chi2 = 2.30, 68.3%) and 95% (5.991) ellipses; present also when invalid, for reference. */
  readonly ellipses: readonly DayMinuteEllipse[];
  /** Sky position: covariance of (azimuth, altitude) and its ellipses. */
  readonly skyCovariance: { readonly azimuth2: number; readonly azimuthAltitude: number; readonly altitude2: number };
  readonly skyEllipses: readonly SkyEllipse[];
  readonly profile?: ProfileScan;
  /**
   * Centre of the ellipses: the continuous optimum, as days from the candidate's civil day
   * (the day itself is the best whole day) and minutes of local apparent time.
   */
  readonly centre: { readonly days: number; readonly localApparentMinutes: number };
  /**
   * False when the evidence does not fix the day and the hour separately (fewer than two measured
   * numbers, or numbers that depend on the sun in the same way: the fit is singular). The day is then
   * free along a curve; no ellipse and no scan interval is given (`profile` absent).
   */
  readonly fixesDayAndHour: boolean;
}

/** One local best fit: a date and hour in one year, under one clock assumption. */
export interface Candidate {
  /** Stable identifier within the answer, e.g. "c3". */
  readonly id: string;
  /** Rank among all candidates of the answer, 1 = best (smallest chi-square). */
  readonly rank: number;
  readonly clockAssumption: ClockAssumption;
  /** Label of the assumption in words: "no clock", "clock kept local mean time (tried)". */
  readonly clockAssumptionLabel: string;
  readonly jdUT: number;
  /**
   * The civil day at the site, in the calendar in force there that day, as the region named it
   * (in Sweden's reckoning of 1700-1712 the name is one day after the Julian date; see civilReckoning).
   */
  readonly civilDate: SolverCalendarDate;
  /** Present when the day was named in a reckoning other than plain Julian or Gregorian: 'swedish'. */
  readonly civilReckoning?: string;
  /** The same day in the other calendar, given when the window is near a calendar switch or the rule is a switch/region. */
  readonly otherCalendarDate?: SolverCalendarDate;
  readonly weekday: number; // 0 = Sunday ... 6 = Saturday
  readonly weekdayName: string;
  readonly times: CandidateTimes;
  readonly sun: {
    readonly azimuthDeg: number;
    readonly altitudeDeg: number; // refracted
    readonly declinationDeg: number;
    readonly hourAngleDeg: number;
  };
  readonly chiSquare: number; // sum of squared normalised residuals, nuisance priors included, soft penalties excluded
  readonly softPenalty: number; // sum of the fact penalties
  /** Measured scalar residuals - 2, never below 0. */
  readonly degreesOfFreedom: number;
  /** Upper-tail probability of chiSquare with degreesOfFreedom; null when no degrees of freedom are left. */
  readonly pValue: number | null;
  /** exp(-(chi2 + penalty)/2) normalised over all candidates of the answer (ellipse volume not included). */
  readonly relativeWeight: number;
  readonly residuals: readonly ResidualEntry[];
  readonly facts: readonly FactEntry[];
  readonly nuisances: readonly NuisanceEntry[];
  readonly uncertainty: CandidateUncertainty;
  /** The least-squares refinement that produced it. */
  readonly fit: { readonly converged: boolean; readonly iterations: number };
  /** True when this year was mapped from a representative year and verified by one full evaluation. */
  readonly mapped: boolean;
  /** The moon at the candidate's instant; present when the scene holds evidence of the moon. */
  readonly moon?: CandidateMoon;
}

/** The moon at a candidate's instant (src/ephemeris/moonPosition.ts), degrees. */
export interface CandidateMoon {
  readonly azimuthDeg: number;
  /** Apparent (refracted) altitude of the centre. */
  readonly altitudeDeg: number;
  readonly illuminatedFraction: number;
  /** Moon's ecliptic longitude minus the sun's, [0, 360): 0 new, 90 first quarter, 180 full, 270 last quarter. */
  readonly phaseLongitudeDeg: number;
  readonly elongationDeg: number;
  /** Where the lit edge faces as seen, from straight up, positive towards the left, (-180, 180]. */
  readonly litSideTiltDeg: number;
  /** "waxing crescent, 12% lit". */
  readonly words: string;
}

/** One clock keeping tried within a family, with how well its best year fits. */
export interface FamilyKeeping {
  readonly clockAssumption: ClockAssumption;
  readonly clockAssumptionLabel: string;
  readonly bestChiSquare: number;
  readonly bestPValue: number | null;
  /** 'fits' (p >= 0.05, facts hold), 'marginal' (0.001 <= p < 0.05), 'does-not-fit'; p judged as for the answer. */
  readonly fit: 'fits' | 'marginal' | 'does-not-fit';
  /** Years in which this keeping has a candidate of the family. */
  readonly yearCount: number;
}

/**
 * Whether the evidence tells the family's years apart. Years whose chi-square (plus penalty) lies
 * within YEARS_ALIKE_DELTA_CHI2 (3.841, one parameter at 95%) of the family's best are alike: the
 * light alone cannot choose between them. A single year is singled out only when it alone is left,
 * and `singledOutBy` then says what did it (the window, its restrictions, or the light itself).
 */
export interface YearsTold {
  readonly singledOut: boolean;
  /** The years alike (the best keeping's), sorted. */
  readonly alikeYears: readonly number[];
  /** Largest difference in chi-square (plus penalty) between the best and any other year of the best keeping; 0 with one year. */
  readonly spreadChiSquare: number;
  /** Largest difference in chi-square (plus penalty) between the best and the other years alike (at most 3.841); 0 with one year. */
  readonly alikeSpreadChiSquare: number;
  /** What singled the year out, in words; present only when singledOut. */
  readonly singledOutBy?: string;
  /** The years in words: "any year 1760-1790 (the light alone cannot tell these years apart)", "1784 (...)". */
  readonly words: string;
}

/**
 * Candidates that differ only by year and by the clock keeping tried (the same days and hours),
 * in one calendar. A family groups the same light: a keeping that puts the same days within a few
 * days and minutes is listed in `keepings`, not counted as another family.
 */
export interface CandidateFamily {
  readonly id: string; // "f1"
  readonly rank: number;
  /** The keeping of the family's best member. */
  readonly clockAssumption: ClockAssumption;
  /** The keepings of the family in words ("clock kept local mean time or local apparent (sundial) time (tried: ...)"). */
  readonly clockAssumptionLabel: string;
  /** Every keeping of the family, best first (one entry without a clock). */
  readonly keepings: readonly FamilyKeeping[];
  /** Whether the light tells the years apart. */
  readonly yearsTold: YearsTold;
  /** The family in one phrase that names no single year unless the evidence singles it out: "5-7 April, any year 1760-1790 (...), 09:08-09:10 local apparent time". */
  readonly headline: string;
  readonly calendar: 'julian' | 'gregorian';
  readonly fromYear: number;
  readonly toYear: number;
  /** Distinct years with a member (never more than the years of the window). */
  readonly yearCount: number;
  /** Earliest and latest month/day over the years (may wrap the year end). */
  readonly fromMonthDay: { readonly month: number; readonly day: number };
  readonly toMonthDay: { readonly month: number; readonly day: number };
  /** Earliest and latest local apparent minute of the members; when they pass midnight (a night's hours), the latest is above 1440. */
  readonly fromLocalApparentMinutes: number;
  readonly toLocalApparentMinutes: number;
  /** The family's best member. */
  readonly best: Candidate;
  readonly bestChiSquare: number;
  readonly bestPValue: number | null;
  /** Summed relative weight of the members. */
  readonly relativeWeight: number;
  /** One line: "any year 1640-1690: 10-16 September (Gregorian), 07:35-07:50 local apparent time". */
  readonly summary: string;
  /** Every member, one per year and keeping; present when the option `perYear` is set. */
  readonly members?: readonly Candidate[];
}

/** Leave-one-out result for one measured observation. */
export interface LeaveOneOutEntry {
  readonly observationId: string;
  readonly observationKind: string;
  /** Scalar residuals this observation contributes. */
  readonly residualCount: number;
  readonly chiSquareAll: number;
  readonly chiSquareWithout: number;
  /** chiSquareAll - chiSquareWithout (>= 0 up to rounding). */
  readonly improvement: number;
  /** Upper-tail probability of the improvement with residualCount degrees of freedom. */
  readonly pValue: number;
  readonly flagged: boolean;
  /** Best candidate without this observation (rank 1 of that refit), when computed. */
  readonly bestWithout?: Candidate;
  readonly note: string;
}

export interface ConsistencyReport {
  /** The rule: "an observation is flagged when removing it improves chi-square with p < 0.01". */
  readonly rule: string;
  readonly pThreshold: number;
  readonly entries: readonly LeaveOneOutEntry[];
  readonly flaggedIds: readonly string[];
}

/**
 * 'fits': best p >= 0.05 and the facts hold (with no degrees of freedom left, p is taken with
 * 1 dof); 'marginal': 0.001 <= p < 0.05; 'nothing-fits': best p < 0.001, or the facts cannot
 * all hold at any candidate (soft penalty above 4: a violation of more than 1 deg);
 * 'no-candidates': no instant in the window (e.g. the sun never where the evidence puts it);
 * 'undetermined': the evidence cannot fix the day and the hour (a clock alone, one measured
 * number, facts without numbers): `freedom` says what is left free and what would fix it.
 */
export type AnswerStatus = 'fits' | 'marginal' | 'nothing-fits' | 'no-candidates' | 'undetermined';

/** What evidence that cannot fix the day and hour leaves free, and which kind of observation would fix it. */
export interface AnswerFreedom {
  /** 'clock-only', 'one-number', 'facts-only', 'same-dependence'. */
  readonly kind: 'clock-only' | 'one-number' | 'facts-only' | 'same-dependence';
  /** "a clock alone fixes the hour, not the day". */
  readonly leftFree: string;
  /** "a measured shadow (...) would fix the day". */
  readonly wouldFix: string;
}

/** A fit found by turning every stated azimuth by 180 deg, when nothing fits as stated. */
export interface TurnedAzimuthsHint {
  readonly best: Candidate;
  /** The words of the hint. */
  readonly words: string;
}

/** Options of solveDates. */
export interface SolveOptions {
  /** Keep every member of each family (one candidate per year). Default false. */
  readonly perYear?: boolean;
  /** Most candidates returned in `candidates`. Default 20. */
  readonly maxCandidates?: number;
  /** Most families returned. Default 10. */
  readonly maxFamilies?: number;
  /** Run the leave-one-out test. Default true. */
  readonly consistency?: boolean;
  /** Only candidates whose chi-square is within this of the best are returned. Default 50. */
  readonly chiSquareCutoff?: number;
  /**
   * Run the profile-likelihood scan where an ellipse is invalid. Default true. False (for bulk
   * runs only) leaves `profile` absent; `method` still says 'profile-scan' and `invalidReason` why.
   */
  readonly profileScans?: boolean;
  /**
   * Called as the work advances: done of total steps (the search, the consistency test or each
   * rerun without one observation, the answer; `done` moves in fractions inside the search and each
   * rerun: stage A's grid rows, stage B's minima) and the stage in plain words
   * (SEARCH_STAGE_WORDS, SOLVE_STAGE_WORDS). For progress lines and bars; the core never writes.
   */
  readonly onProgress?: (done: number, total: number, stage?: string) => void;
}

/** Diagnostics of the search, for the curious and for the bench. */
export interface SolverDiagnostics {
  readonly stageAGridPoints: number;
  readonly stageAMinima: number;
  readonly fullRefinements: number;
  readonly mappedYears: number;
  readonly chiSquareEvaluations: number;
  readonly clockAssumptionsTried: number;
  /** Calls of the moon's ephemeris (present with moon evidence). */
  readonly moonEvaluations?: number;
  /** Days screened with the full moon ephemeris, and years refined with the moon (src/solver/moonYears.ts). */
  readonly moonScreenedDays?: number;
  readonly moonRefinedYears?: number;
}

/** A year a near-repeat of the moon away from the best year, with its fit. */
export interface MoonNearRepeat {
  readonly year: number;
  /** Years from the best year (negative: earlier). */
  readonly offsetYears: number;
  /** "19-year (235 lunations)", "8-year (99 lunations)", "11-year (136 lunations)". */
  readonly cycle: string;
  /** Its best objective (chi-square plus penalty) minus the best year's; null when the search has no candidate of that light in that year. */
  readonly deltaChiSquare: number | null;
  /** Upper-tail probability of deltaChiSquare with 1 degree of freedom; null with it. */
  readonly pValue: number | null;
  /** True when within 3.841 (one parameter, 95%): it fits as well as the best year. */
  readonly fitsAlike: boolean;
  /** False when that year was screened only (it fit far worse): deltaChiSquare is then an upper bound. */
  readonly refined: boolean;
}

/** A year that fits alike with the moon (within 3.841 of the best), with its fit and its best day. */
export interface MoonAlikeYear {
  readonly year: number;
  /** Years from the best year (negative: earlier; 0 for the best year itself). */
  readonly offsetYears: number;
  /** Whole lunations (mean synodic month, 29.530589 days) between the best candidate's day and this one. */
  readonly lunations: number;
  /** The day of that year's best candidate, in the scene's calendar. */
  readonly civilDate: SolverCalendarDate;
  /** Its best objective (chi-square plus penalty) minus the best year's (0 for the best year). */
  readonly deltaChiSquare: number;
  /** Upper-tail probability of deltaChiSquare with 1 degree of freedom. */
  readonly pValue: number;
  /** True when that year's best candidate is of the best candidate's light (the same track of the sun). */
  readonly sameLight: boolean;
}

/** What the moon says about the years (src/solver/moonAnswer.ts). */
export interface MoonYearsAnswer {
  /** The best year of the best light. */
  readonly bestYear: number;
  /**
   * The years that fit alike (their best candidate, of any light, within 3.841 of the best: one
   * parameter at 95%), sorted; the best year among them.
   */
  readonly years: readonly number[];
  /** The same years with their fit, their day and their distance from the best year in lunations, sorted by year. */
  readonly alike: readonly MoonAlikeYear[];
  /** In words: "The moon names 1790 ...". */
  readonly words: string;
  /** The near-repeats of the best year inside the window, with their fit. */
  readonly nearRepeats: readonly MoonNearRepeat[];
  /** Plain words for a moon that cannot be (lit side away from the sun, a phase impossible at its distance from the sun). */
  readonly impossible: readonly string[];
  /** Cautions for the notes. */
  readonly cautions: readonly string[];
}

/** The answer to "on what dates and hours could this light have fallen?". */
export interface DateAnswer {
  readonly sceneTitle: string;
  readonly status: AnswerStatus;
  /** One or two sentences in plain words, e.g. "Nothing fits: the north wall cannot be sunlit ...". */
  readonly verdict: string;
  readonly window: { readonly fromYear: number; readonly toYear: number };
  /**
   * The best family in one phrase (its headline; a single year only when the evidence singles it
   * out, and then what did), or null without candidates. Charts and reports use it for titles.
   */
  readonly headline: string | null;
  /** The years of the answer in words for a title: "any year 1760-1790" or "1784"; null without candidates. */
  readonly yearsWords: string | null;
  /** Present when status is 'undetermined'. */
  readonly freedom?: AnswerFreedom;
  /** Present when nothing fits as stated but every azimuth turned by 180 deg would fit. */
  readonly turnedAzimuths?: TurnedAzimuthsHint;
  /** Number of families found (before maxFamilies cut the list). */
  readonly familyCount: number;
  readonly families: readonly CandidateFamily[];
  /** The best candidates over all years, ranked (at most maxCandidates). */
  readonly candidates: readonly Candidate[];
  readonly consistency: ConsistencyReport;
  /** Each group of observations (their `group` label) tested against the rest: one sun for all, or its own (groupConsistency.ts). */
  readonly groupTests?: readonly GroupTest[];
  /** What the moon says about the years; present when the scene holds evidence of the moon. */
  readonly moon?: MoonYearsAnswer;
  /** Observations named as conflicting when status is 'nothing-fits'. */
  readonly conflictingIds: readonly string[];
  readonly clockAssumptions: readonly ClockAssumption[];
  /** Number of measured scalar residuals. */
  readonly measuredResiduals: number;
  /** Cautions in words (assumptions, models, what is left out). */
  readonly notes: readonly string[];
  readonly diagnostics: SolverDiagnostics;
  readonly seed: number;
}

/** A proposed date, range or season for checkProposal. Days are civil days in the site's calendar. */
export type Proposal =
  | {
      readonly kind: 'day';
      readonly day: CivilDay;
      /** Optional time of day, minutes after midnight, in the clock named (default local apparent). */
      readonly timeMinutes?: number;
      readonly timeClock?: ClockKind;
      /** Tolerance on the proposed time, minutes (default 0: the time is fixed). */
      readonly timeToleranceMinutes?: number;
    }
  | { readonly kind: 'range'; readonly from: CivilDay; readonly to: CivilDay }
  | {
      readonly kind: 'season';
      readonly months: readonly number[];
      /** Years to consider; default the scene's window. */
      readonly fromYear?: number;
      readonly toYear?: number;
    };

/**
 * Judged against the best fit in the window (`relative`): 'consistent' when the proposal lies
 * within the 95% region around the best (Delta chi-square p >= 0.05) and its facts hold;
 * 'doubtful' when 0.001 <= p < 0.05; 'inconsistent' when p < 0.001 or a fact fails.
 */
export type CheckVerdict = 'consistent' | 'doubtful' | 'inconsistent';

/** The proposal's own fit (its chi-square judged alone). */
export interface CheckAbsoluteFit {
  readonly chiSquare: number;
  /** Measured numbers minus what is fitted inside the proposal (0 for a fixed day and time, 1 for a day, 2 for a range or season), never below 0. */
  readonly degreesOfFreedom: number;
  /** Null when no degrees of freedom are left. */
  readonly pValue: number | null;
  readonly softPenalty: number;
}

/** The proposal against the best fit in the window (a likelihood-ratio test, Wilks 1938). */
export interface CheckRelativeFit {
  /** Proposal's chi-square + penalty minus the window's best (never below 0). */
  readonly deltaChiSquare: number;
  /** Parameters the proposal fixes: 2 for a day and time, 1 for a day, a range or a season. */
  readonly degreesOfFreedom: number;
  readonly pValue: number;
  /** exp(-deltaChiSquare / 2): how much less likely the evidence is at the proposal than at the best. */
  readonly likelihoodRatio: number;
  /** 'as-good' within the 68.3% region, 'within-95', 'outside-95', 'outside-99.9'. */
  readonly region: 'as-good' | 'within-95' | 'outside-95' | 'outside-99.9';
}

/** How well the evidence as a whole fits (the window's best), said apart from the verdict. */
export interface CheckOverallFit {
  readonly chiSquare: number;
  readonly degreesOfFreedom: number;
  readonly pValue: number | null;
  /** True when the best fit in the window is itself weak (p < 0.05) or a fact fails there. */
  readonly weak: boolean;
  readonly words: string;
}

/** The answer to "could the light have fallen on this date / in this range / season?". */
export interface CheckAnswer {
  readonly sceneTitle: string;
  readonly proposal: Proposal;
  readonly verdict: CheckVerdict;
  /** One line in plain words. */
  readonly verdictText: string;
  /** Best fit inside the proposal (null when the proposal contains no instant with the sun up). */
  readonly best: Candidate | null;
  readonly chiSquare: number | null;
  readonly degreesOfFreedom: number;
  readonly pValue: number | null;
  /** The unrestricted best fit in the scene's window, for comparison. */
  readonly globalBest: Candidate | null;
  /** The best family in the window in words (its headline: a single year only when the evidence singles it out). */
  readonly globalHeadline: string | null;
  /** best.chiSquare - globalBest.chiSquare (penalties included). */
  readonly deltaChiSquareToGlobal: number | null;
  /** The proposal's own fit; null without a fit. */
  readonly absolute: CheckAbsoluteFit | null;
  /** Against the best in the window; null without either fit. */
  readonly relative: CheckRelativeFit | null;
  /** The evidence as a whole; null without a best fit in the window. */
  readonly overall: CheckOverallFit | null;
  readonly notes: readonly string[];
}

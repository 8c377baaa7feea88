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
  readonly measured: number;
  readonly predicted: number;
  /** Unit of measured and predicted: 'deg', 'ratio', 'min', 'm'. */
  readonly unit: string;
  readonly sigma: number;
  /** (measured - predicted) / sigma, wrapped where the quantity is periodic (angles, clock modulo 60 or 720 min). */
  readonly normalised: number;
}

/** A fact without a number (wall lit or shaded, sun up) at a candidate. */
export interface FactEntry {
  readonly observationId: string;
  readonly observationKind: 'wall-lit' | 'wall-shaded' | 'sun-up' | 'rod-side' | 'fin-side';
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
export interface NuisanceEntry {
  /** 'wall:<id>:azimuth', 'site:latitude', 'site:longitude'. */
  readonly name: string;
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
  /** 'ellipse': the linearised covariance is valid; 'profile-scan': it is not and the scan gives the interval. */
  readonly method: 'ellipse' | 'profile-scan';
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
  readonly degreesOfFreedom: number; // measured scalar residuals - 2
  /** Upper-tail probability of chiSquare with degreesOfFreedom; null when degreesOfFreedom <= 0. */
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
}

/** Candidates that differ only by year, under one clock assumption and one calendar. */
export interface CandidateFamily {
  readonly id: string; // "f1"
  readonly rank: number;
  readonly clockAssumption: ClockAssumption;
  readonly clockAssumptionLabel: string;
  readonly calendar: 'julian' | 'gregorian';
  readonly fromYear: number;
  readonly toYear: number;
  readonly yearCount: number;
  /** Earliest and latest month/day over the years (may wrap the year end). */
  readonly fromMonthDay: { readonly month: number; readonly day: number };
  readonly toMonthDay: { readonly month: number; readonly day: number };
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
  /** Every member, one per year; present when the option `perYear` is set. */
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
 * 'no-candidates': no instant in the window (e.g. the sun never where the evidence puts it).
 */
export type AnswerStatus = 'fits' | 'marginal' | 'nothing-fits' | 'no-candidates';

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
  /** Called as the work advances (done of total steps: the search, each rerun, the answer); for progress lines. */
  readonly onProgress?: (done: number, total: number) => void;
}

/** Diagnostics of the search, for the curious and for the bench. */
export interface SolverDiagnostics {
  readonly stageAGridPoints: number;
  readonly stageAMinima: number;
  readonly fullRefinements: number;
  readonly mappedYears: number;
  readonly chiSquareEvaluations: number;
  readonly clockAssumptionsTried: number;
}

/** The answer to "on what dates and hours could this light have fallen?". */
export interface DateAnswer {
  readonly sceneTitle: string;
  readonly status: AnswerStatus;
  /** One or two sentences in plain words, e.g. "Nothing fits: the north wall cannot be sunlit ...". */
  readonly verdict: string;
  readonly window: { readonly fromYear: number; readonly toYear: number };
  readonly families: readonly CandidateFamily[];
  /** The best candidates over all years, ranked (at most maxCandidates). */
  readonly candidates: readonly Candidate[];
  readonly consistency: ConsistencyReport;
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

/** 'consistent': p >= 0.05; 'doubtful': 0.001 <= p < 0.05; 'inconsistent': p < 0.001 or facts violated. */
export type CheckVerdict = 'consistent' | 'doubtful' | 'inconsistent';

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
  /** best.chiSquare - globalBest.chiSquare. */
  readonly deltaChiSquareToGlobal: number | null;
  readonly notes: readonly string[];
}

/**
 * The scene model: what a scholar states about a depicted place and its light.
 *
 * These are the validated, in-memory forms produced by the scene reader
 * (src/scene/readScene.ts) from a YAML or JSON scene file. Field names carry
 * their unit; every measured number has its sigma beside it. Conventions
 * (azimuth origin, wall axes, pixel axes) are in docs/conventions.md.
 */
import type { DeltaTModel } from '../time/deltaT.js';
import type { SkyPlane } from '../geometry/skyPlanes.js';


/** A point in image pixels: x to the right, y down, origin at the top-left corner of the top-left pixel. */
export type PixelPoint = readonly [xPx: number, yPx: number];

/** A point in a wall's own plane, metres: u to the right and v up, as seen from outside facing the wall. */
export type WallPoint = readonly [uM: number, vM: number];

/** A point on level ground, metres east and north of an arbitrary site origin. */
export type GroundPoint = readonly [eastM: number, northM: number];

/** A point in site coordinates, metres east, north and up. */
export type SitePoint = readonly [eastM: number, northM: number, upM: number];

export interface Site {
  readonly latitudeDeg: number; // north positive, [-90, 90]
  readonly longitudeDeg: number; // east positive, [-180, 180]
  readonly elevationM: number;
  readonly latitudeSigmaDeg: number; // 0 = known exactly
  readonly longitudeSigmaDeg: number;
}

/** Which civil calendar was in force: fixed, a region of data/calendar-reforms.json, or a user's own switch. */
export type CalendarRule =
  | { readonly kind: 'julian' }
  | { readonly kind: 'gregorian' }
  | { readonly kind: 'region'; readonly regionId: string; /** One published reading of a disputed switch (its id); absent: the row's main reading. */ readonly reading?: string }
  | {
      readonly kind: 'switch';
      /** Last Julian civil day, Julian calendar. */
      readonly lastJulian: { readonly year: number; readonly month: number; readonly day: number };
      /** First Gregorian civil day, Gregorian calendar. */
      readonly firstGregorian: { readonly year: number; readonly month: number; readonly day: number };
    };

/** Where the numbered year began (src/calendar/yearStart.ts). */
export type YearStartStyle =
  | 'jan1' // 1 January (circumcision style / modern)
  | 'mar25-forward' // 25 March following 1 January (annunciation style, Florentine / English)
  | 'mar25-backward' // 25 March preceding 1 January (Pisan style)
  | 'mar1' // 1 March (Venetian style)
  | 'dec25'; // 25 December (nativity style)

/** What a clock kept (src/time/clock.ts). */
export type ClockKind =
  | { readonly kind: 'apparent' } // local apparent (sundial) time at the site
  | { readonly kind: 'mean' } // local mean time at the site's longitude
  | { readonly kind: 'meridian'; readonly longitudeDeg: number } // mean time of another meridian
  | { readonly kind: 'zone'; readonly zone: string } // IANA zone through luxon
  | { readonly kind: 'ut' }
  /** Italian hours: 24 hours from the previous evening's sunset (or end of civil twilight), plus offsetMinutes (src/time/hourSystems.ts). */
  | { readonly kind: 'italian'; readonly origin: 'sunset' | 'civil-dusk'; readonly offsetMinutes: number }
  | { readonly kind: 'babylonian' } // 24 hours from sunrise
  | { readonly kind: 'unequal' }; // temporal hours: twelfths of daylight and of night

/** A civil date as written in the site's calendar (after year-start normalisation: year begins 1 January). */
export interface CivilDay {
  readonly year: number; // astronomical numbering
  readonly month: number; // 1-12
  readonly day: number; // 1-31
}

export interface DateWindow {
  readonly fromYear: number; // inclusive, astronomical numbering, historical (January-start) years
  readonly toYear: number; // inclusive
  readonly notBefore?: CivilDay; // documentary bound, civil date in the site's calendar
  readonly notAfter?: CivilDay;
  /** Allowed months (1-12) in the site's civil calendar; empty or absent = all. */
  readonly months?: readonly number[];
  /** Allowed weekday, 0 = Sunday ... 6 = Saturday. */
  readonly weekday?: number;
}

/** Air for refraction; absent means standard air (1010 hPa, 10 C). */
export interface Air {
  readonly pressureHPa: number;
  readonly temperatureC: number;
}

/** The picture the pixel measurements were taken on. */
export interface ImageInfo {
  readonly widthPx: number;
  readonly heightPx: number;
  readonly file?: string; // JPEG or PNG beside the scene file, for the overlay only
  readonly mirrored: boolean; // a reversed print: x is flipped before anything else
  readonly pixelSigmaPx: number; // the user's clicking precision, default for every point
}

/**
 * The ground fixed by the foot lines of two walls of known azimuth that meet at a corner, each wall
 * rectified from its own imagePlane in metres (src/image/groundFromWalls.ts).
 */
export interface GroundFromWalls {
  /** Ids of the two walls. */
  readonly walls: readonly [string, string];
  /** The image point where both walls meet the ground. */
  readonly cornerPx: PixelPoint;
  /** Its clicking sigma, else the image's pixelSigmaPx. */
  readonly cornerSigmaPx?: number;
}

/** The image of a figure on a wall (or the ground) whose true shape is known. */
export interface PlaneInImage {
  readonly pointsPx: readonly PixelPoint[]; // at least 4; empty when fromWalls is given
  /** Ground only, instead of clicked points: the ground from two walls meeting at a corner. */
  readonly fromWalls?: GroundFromWalls;
  /** True coordinates of the same points in the plane, metres (wall: u right, v up; ground: east, north). */
  readonly planePointsM?: readonly (readonly [number, number])[];
  /** Or a rectangle: pointsPx are its corners in order top-left, top-right, bottom-right, bottom-left (wall) ... */
  readonly widthM?: number;
  readonly heightM?: number;
  /** ... or only its aspect ratio width / height (scale then comes from the observation's own length in metres). */
  readonly aspect?: number;
  /** Ground rectangles only: true azimuth of the edge from the first corner to the second. */
  readonly firstEdgeAzimuthDeg?: number;
  readonly pointSigmaPx?: readonly number[]; // per point, else the image's pixelSigmaPx
}

export interface Wall {
  readonly id: string;
  /** Azimuth of the outward normal, degrees clockwise from true north, [0, 360). */
  readonly azimuthDeg: number;
  readonly azimuthSigmaDeg: number; // 0 = known exactly
  /** How the azimuth was obtained, in words, for the report ("from two map points", "stated"). */
  readonly azimuthSource: string;
  /** The wall's plane in the picture, when observations on it are given in pixels. */
  readonly imagePlane?: PlaneInImage;
  /** The scholar's own words about this wall, carried into the report. */
  readonly note?: string;
}

/** Clicked points along one straight edge of the picture, two or more. */
export type PixelLine = readonly PixelPoint[];

/**
 * The picture's camera from its perspective (src/image/camera.ts): lines along edges vertical in the scene,
 * and lines along the horizontal edges of walls of stated azimuth.
 */
export interface CameraBlock {
  readonly verticalLines: readonly PixelLine[];
  readonly wallLines: readonly { readonly wallId: string; readonly lines: readonly PixelLine[] }[];
  /** The focal length in pixels when known (the principal point is then the picture's centre). */
  readonly focalLengthPx?: number;
  /** Clicking sigma of every line point, else the image's pixelSigmaPx. */
  readonly sigmaPx?: number;
}

/** Which way a shadow runs on a wall, as seen from outside facing the wall. */
export type Side = 'left' | 'right';

interface ObservationBase {
  readonly id: string;
  /** The scholar's own words about this observation, carried into the report. */
  readonly note?: string;
  /**
   * A part of the picture ("architecture", "figures"): the date answer tests each group against the rest
   * (src/solver/groupConsistency.ts); object-shadow pairs of one group also share one sun direction.
   */
  readonly group?: string;
}

/** The light that casts a shadow: the sun (the default when absent) or the moon (docs/moon-evidence.md). */
export type ShadowLight = 'sun' | 'moon';

/** Every shadow kind: its light, absent for the sun. */
interface ShadowBase extends ObservationBase {
  /** 'moon' for a shadow cast by moonlight; absent (or 'sun') for sunlight. */
  readonly light?: ShadowLight;
}

/** Two image points along a line, for pixel forms. */
export interface PixelSegment {
  readonly fromPx: PixelPoint;
  readonly toPx: PixelPoint;
  readonly sigmaPx?: number;
}

/** 1. Shadow of a rod standing straight out of a wall: slope of its shadow on the wall, below horizontal. */
export interface RodShadowObservation extends ShadowBase {
  readonly kind: 'rod-shadow';
  readonly wallId: string;
  readonly slopeDeg?: number; // (0, 90): angle of the shadow below the horizontal, on the frontal view
  readonly side?: Side; // the shadow runs down to the left or to the right
  readonly sigmaDeg?: number;
  /** Pixel form: from the rod's root to a point further along its shadow, on the wall's imagePlane. */
  readonly pixels?: PixelSegment;
}

/** 2. Overhang: shadow depth on the wall below the edge, over the projection depth: tan(VSA). */
export interface OverhangShadowObservation extends ShadowBase {
  readonly kind: 'overhang-shadow';
  readonly wallId: string;
  readonly depthRatio?: number; // shadow depth / projection depth, >= 0
  readonly sigma?: number;
  /** Pixel form: from the overhang's root line down to its shadow line, plus the projection in metres. */
  readonly pixels?: PixelSegment & ProjectionPart;
}

/** 3. Fin: sideways shadow width on the wall over the fin's depth: tan(|HSA|), with the side it falls to. */
export interface FinShadowObservation extends ShadowBase {
  readonly kind: 'fin-shadow';
  readonly wallId: string;
  readonly widthRatio?: number; // >= 0
  readonly side?: Side; // the shadow falls to this side of the fin, seen from outside
  readonly sigma?: number;
  readonly pixels?: PixelSegment & ProjectionPart;
}

/** 4. Vertical pole or building corner on level ground. */
export interface PoleShadowObservation extends ShadowBase {
  readonly kind: 'pole-shadow';
  readonly shadowAzimuthDeg?: number; // direction from the foot to the shadow tip, clockwise from true north
  readonly shadowAzimuthSigmaDeg?: number;
  readonly lengthRatio?: number; // shadow length / pole height = 1 / tan(altitude)
  readonly lengthRatioSigma?: number;
  /** Pixel form on the ground plane: foot and shadow tip, with the pole's height in metres. */
  readonly pixels?: PixelSegment & { readonly heightM?: number; readonly heightSigmaM?: number };
}

/** 5. Eave's shadow line on level ground: its distance out from the wall over the eave's height. */
export interface EaveShadowObservation extends ShadowBase {
  readonly kind: 'eave-shadow';
  readonly wallId: string;
  /** Distance of the shadow line from the wall foot, measured along the wall normal, over the eave's height above the ground. */
  readonly distanceRatio?: number;
  readonly sigma?: number;
  /** How far the eave edge stands out from the wall, over its height; 0 when the edge is on the wall plane. */
  readonly projectionRatio?: number;
  /**
   * Pixel form on the ground plane: fromPx on the wall's foot line, alongPx a second point of that foot line,
   * toPx a point of the eave's shadow line; the eave's height (and projection) in metres.
   */
  readonly pixels?: EavePixels;
}

/** The clicks and stated lengths of an eave's shadow line measured on the ground plane. */
export interface EavePixels extends PixelSegment {
  /** A second point of the wall's foot line (fromPx is the first). */
  readonly alongPx: PixelPoint;
  readonly heightM: number;
  readonly heightSigmaM: number;
  /** How far the eave edge stands out from the wall, metres; 0 when the edge is on the wall plane. */
  readonly projectionM: number;
  readonly projectionSigmaM: number;
}

/** 6. A caster point and its shadow point, surveyed, site coordinates. */
export interface ShadowPointsObservation extends ShadowBase {
  readonly kind: 'shadow-points';
  readonly caster?: SitePoint;
  readonly shadow?: SitePoint;
  readonly sigmaM?: number; // per coordinate, both points
  /** Pixel form: the caster's foot and its shadow clicked on a plane (the ground, or a wall). */
  readonly pixels?: ShadowPointsPixels;
}

/**
 * A caster point and its shadow point clicked on one plane: fromPx is the caster's foot (the point of the plane
 * straight below it, or behind it on a wall), toPx the shadow point. The caster stands heightM out of the plane
 * (a plane of known size), or is clicked itself at objectPx (a plane put into the picture by the camera).
 */
export interface ShadowPointsPixels extends PixelSegment {
  /** The wall the points lie on; absent: the ground. */
  readonly wallId?: string;
  readonly heightM?: number;
  readonly heightSigmaM?: number;
  readonly objectPx?: PixelPoint;
}

/** 7. A sun direction estimated by other means. */
export interface SunDirectionObservation extends ObservationBase {
  readonly kind: 'sun-direction';
  readonly azimuthDeg: number;
  readonly azimuthSigmaDeg: number;
  readonly altitudeDeg: number;
  readonly altitudeSigmaDeg: number;
}

/** 8. Facts without numbers. */
export interface WallLightObservation extends ObservationBase {
  readonly kind: 'wall-lit' | 'wall-shaded';
  readonly wallId: string;
}
/** The sun is up ('sun-up'), or below the horizon ('sun-not-up': a night view). */
export interface SunUpObservation extends ObservationBase {
  readonly kind: 'sun-up' | 'sun-not-up';
}

/**
 * 10. An object point and the point of its shadow, clicked on the picture, wherever the shadow falls (steps,
 * uneven paving, a curved wall). Needs the scene's `camera`: the line from the object to its shadow is the
 * image of a sun ray (src/image/cameraSun.ts). Pairs of one group are combined into one sun direction.
 */
export interface ObjectShadowObservation extends ShadowBase {
  readonly kind: 'object-shadow';
  readonly objectPx: PixelPoint;
  readonly shadowPx: PixelPoint;
  /** Clicking sigma of both points, else the image's pixelSigmaPx. */
  readonly sigmaPx?: number;
  /**
   * Filled in through the camera before solving (src/image/resolvePixels.ts), never read from the file: the
   * pair's great circle of the sky and the two side planes that keep the sun on its arc (src/image/sunConstraints.ts).
   */
  readonly circle?: SkyPlane;
  readonly sides?: readonly [SkyPlane, SkyPlane];
}

/**
 * How far an overhang or fin stands out from its wall, in a pixel form: in metres, or (with the wall put into the
 * picture by the camera) as the clicked point of its front edge straight out from the segment's first point.
 */
export type ProjectionPart =
  | { readonly projectionM: number; readonly projectionSigmaM: number; readonly tipPx?: undefined }
  | { readonly tipPx: PixelPoint; readonly projectionM?: undefined; readonly projectionSigmaM?: undefined };

/** 8b. A shadow point whose object point is known only to lie within a wedge seen from it (needs the camera). */
export interface ShadowWedgeObservation extends ShadowBase {
  readonly kind: 'shadow-wedge';
  readonly shadowPx: PixelPoint;
  /** Two image points, one on each bounding direction of the wedge, as seen from the shadow point. */
  readonly edgesPx: readonly [PixelPoint, PixelPoint];
  readonly sigmaPx?: number;
  /** Filled in through the camera before solving: the two side planes of the wedge's lune of the sky. */
  readonly edges?: readonly [SkyPlane, SkyPlane];
}

/** 9. A clock in the picture. */
export interface ClockObservation extends ObservationBase {
  readonly kind: 'clock';
  readonly readingMinutes: number; // minutes after midnight as read, [0, 1440) (12-hour dials: [0, 720), 6-hour dials: [0, 360))
  readonly precisionMinutes: number; // sigma of the reading
  readonly hourHandTrusted: boolean; // false: known only modulo one hour
  /** Hours on the dial: 24; 12 (the count shown twice a day); 6 (Italian "sei ore" dials, the count shown four times). */
  readonly dialHours: 6 | 12 | 24;
  /** What the clock kept; 'unknown' means each kind is tried and reported. */
  readonly kept: ClockKind | { readonly kind: 'unknown' };
}

/** The hour lines of a sundial: what its shadow's place on the dial counts (src/time/hourSystems.ts). */
export type SundialHours =
  | { readonly kind: 'apparent' } // equal hours from midnight: local apparent time
  | { readonly kind: 'italian'; readonly origin: 'sunset'; readonly offsetMinutes: 0 } // hours since the previous sunset
  | { readonly kind: 'babylonian' } // hours since sunrise
  | { readonly kind: 'unequal' }; // twelfths of the daylight from sunrise, 0-12

/** 12. A sundial in the picture, read where the shadow falls among its hour lines. */
export interface SundialObservation extends ObservationBase {
  readonly kind: 'sundial';
  /** The reading on the dial's own count, minutes, [0, 1440): 10:30 on an ordinary dial is 630. */
  readonly readingMinutes: number;
  readonly precisionMinutes: number; // sigma of the reading
  readonly hours: SundialHours;
}

/**
 * 13. The moon's direction in the sky (apparent: refracted altitude of its centre): as numbers, or in
 * pixels (its centre clicked in the picture, turned into a direction through the scene's camera or a wall's
 * or the ground's figure: src/image/moonPixels.ts, before solving; docs/moon-evidence.md).
 */
export type MoonDirectionObservation = ObservationBase & { readonly kind: 'moon-direction' } & (
  | {
    readonly azimuthDeg: number;
    readonly azimuthSigmaDeg: number;
    readonly altitudeDeg: number;
    readonly altitudeSigmaDeg: number;
    readonly pixels?: undefined;
  }
  | {
    readonly pixels: MoonPixels;
    readonly azimuthDeg?: undefined;
    readonly azimuthSigmaDeg?: undefined;
    readonly altitudeDeg?: undefined;
    readonly altitudeSigmaDeg?: undefined;
  }
);

/** The moon's centre clicked in the picture, and what turns it into a direction. */
export interface MoonPixels {
  readonly centrePx: PixelPoint;
  /** Clicking sigma of the centre, else the image's pixelSigmaPx. */
  readonly sigmaPx?: number;
  /** Through this wall's imagePlane; absent: through the scene's camera block, else its groundPlane. */
  readonly wallId?: string;
}

/** The named phases a scholar may write (docs/moon-evidence.md gives the phase longitude of each). */
export type NamedMoonPhase =
  | 'new' | 'waxing crescent' | 'first quarter' | 'waxing gibbous' | 'full'
  | 'waning gibbous' | 'last quarter' | 'waning crescent' | 'crescent' | 'gibbous';

/**
 * 14. The moon's phase as drawn: the illuminated fraction of its disc with a sigma, or a named phase
 * with a sigma in degrees of phase longitude (default MOON_PHASE_DEFAULT_SIGMA_DEG of src/solver/moonEvidence.ts).
 */
export type MoonPhaseObservation = ObservationBase & { readonly kind: 'moon-phase' } & (
  | { readonly illuminatedFraction: number; readonly sigma: number; readonly phase?: undefined }
  | { readonly phase: NamedMoonPhase; readonly sigmaDeg: number; readonly illuminatedFraction?: undefined }
);

/**
 * 15. Where the lit side of the moon faces, as drawn: the direction from the disc's centre to the middle
 * of its lit edge, degrees from straight up in the picture, positive towards the left (0 lit on top, 90 lit
 * on the left, -90 lit on the right, 180 lit at the bottom), (-180, 180], as the print shows it (a reversed
 * print, image.mirrored, is flipped by the solver). The picture's up is taken as the true vertical.
 */
export interface MoonLitSideObservation extends ObservationBase {
  readonly kind: 'moon-lit-side';
  readonly litSideDeg: number;
  readonly sigmaDeg: number;
}

/** 16. Facts without numbers: the moon is in the sky (above the horizon), or it is not. */
export interface MoonFactObservation extends ObservationBase {
  readonly kind: 'moon-up' | 'moon-not-up';
}

export type Observation =
  | RodShadowObservation
  | OverhangShadowObservation
  | FinShadowObservation
  | PoleShadowObservation
  | EaveShadowObservation
  | ShadowPointsObservation
  | SunDirectionObservation
  | WallLightObservation
  | SunUpObservation
  | ClockObservation
  | SundialObservation
  | ObjectShadowObservation
  | ShadowWedgeObservation
  | MoonDirectionObservation
  | MoonPhaseObservation
  | MoonLitSideObservation
  | MoonFactObservation;

export type ObservationKind = Observation['kind'];

export interface Scene {
  readonly formatVersion: 1;
  readonly title: string;
  readonly site: Site;
  readonly calendar: CalendarRule;
  readonly yearStart: YearStartStyle;
  readonly window: DateWindow;
  readonly air?: Air;
  /** The Delta T model (src/time/deltaT.ts); absent: the default, morrison-2021. */
  readonly deltaT?: DeltaTModel;
  /** Added to map bearings (magnetic or grid north) to get true bearings, degrees. */
  readonly mapNorthCorrectionDeg: number;
  readonly image?: ImageInfo;
  /** The picture's camera from its vanishing lines, when observations need it (object-shadow). */
  readonly camera?: CameraBlock;
  /** The level ground in the picture, when ground observations are given in pixels. */
  readonly groundPlane?: PlaneInImage;
  readonly walls: readonly Wall[];
  readonly observations: readonly Observation[];
  /** Seed for every Monte Carlo run, printed in every report. */
  readonly seed: number;
}

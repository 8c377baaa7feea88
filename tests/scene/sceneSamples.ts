/**
 * Scenes for the tests of the reader and its schema: one small valid scene,
 * valid variants of it, and invalid variants, each with the path the reader
 * must name and whether the JSON Schema alone can see the fault.
 * (Invented data in the fictional town of Velmar.)
 */

type Data = Record<string, unknown>;

/** A small valid scene as plain data. */
export function minimalScene(): Data {
  return {
    heliochron: 1,
    title: "Velmar, the Tanners' Hall, a drawing",
    site: { latitudeDeg: 47.62, longitudeDeg: 9.35 },
    calendar: 'gregorian',
    window: { fromYear: 1700, toYear: 1750 },
    walls: [{ id: 'tanners-hall-front', azimuthDeg: 262, azimuthSigmaDeg: 1.5 }],
    observations: [{ id: 'bracket', kind: 'rod-shadow', wall: 'tanners-hall-front', slopeDeg: 38, side: 'left', sigmaDeg: 2 }],
  };
}

const IMAGE = { widthPx: 2000, heightPx: 1500 };
const WALL_PLANE = { pointsPx: [[100, 100], [900, 120], [880, 900], [110, 880]], widthM: 8, heightM: 7 };

/** Apply a change to a copy of the minimal scene: set (or, with undefined, delete) a value at a dotted path. */
export function variant(changes: Readonly<Record<string, unknown>>): Data {
  const scene = structuredClone(minimalScene());
  for (const [path, value] of Object.entries(changes)) {
    const parts = path.split('.').map((p) => (/^\d+$/.test(p) ? Number(p) : p));
    let node: any = scene;
    for (const p of parts.slice(0, -1)) node = node[p];
    const last = parts[parts.length - 1];
    if (value === undefined) {
      if (Array.isArray(node)) node.splice(last as number, 1);
      else delete node[last];
    } else node[last] = value;
  }
  return scene;
}

const obs = (o: Data): Data => variant({ 'observations.0': o });

/** Valid scenes: every kind of observation and every form. */
/** A camera block of two vertical lines, two lines along the front and a given focal length. */
const SAMPLE_CAMERA = {
  verticalLines: [[[100, 100], [102, 800]], [[700, 90], [699, 820]]],
  wallLines: [{ wall: 'tanners-hall-front', lines: [[[100, 200], [600, 260]], [[100, 500], [600, 480]]] }],
  focalLengthPx: 1500,
};

export const GOOD_SCENES: readonly { readonly name: string; readonly data: Data }[] = [
  { name: 'minimal', data: minimalScene() },
  { name: 'site in degrees-minutes-seconds', data: variant({ site: { latitudeDeg: "47°37'12\"N", longitudeDeg: '9 21 E' } }) },
  { name: 'site with hemisphere letters', data: variant({ site: { latitudeDeg: '33.9 S', longitudeDeg: '18.4W' } }) },
  { name: 'latitude as quoted decimal', data: variant({ 'site.latitudeDeg': '47.62' }) },
  { name: 'all site fields', data: variant({ site: { latitudeDeg: -33.9, longitudeDeg: -18.4, elevationM: 12, latitudeSigmaDeg: 0.01, longitudeSigmaDeg: 0.02 } }) },
  { name: 'region calendar', data: variant({ calendar: 'protestant-germany', yearStart: 'jan1' }) },
  { name: 'switch calendar map', data: variant({ calendar: { lastJulian: '1700-02-18', firstGregorian: '1700-03-01' } }) },
  { name: 'full window', data: variant({ window: { fromYear: 1700, toYear: 1750, notBefore: '1701-03-01', notAfter: '1749-10-31', months: [5, 'june', 9], weekday: 'sunday' } }) },
  { name: 'weekday number', data: variant({ 'window.weekday': 0 }) },
  { name: 'air', data: variant({ air: { pressureHPa: 960 } }) },
  { name: 'map points wall', data: variant({ 'walls.0': { id: 'tanners-hall-front', mapPoints: { fromM: [0, 0], toM: [3, 4], outward: 'left' }, azimuthSigmaDeg: 0 } }) },
  { name: 'overhang', data: obs({ id: 'o', kind: 'overhang-shadow', wall: 'tanners-hall-front', depthRatio: 0, sigma: 0.1 }) },
  { name: 'fin', data: obs({ id: 'o', kind: 'fin-shadow', wall: 'tanners-hall-front', widthRatio: 1.2, side: 'right', sigma: 0.1, note: 'the buttress' }) },
  { name: 'pole azimuth only', data: obs({ id: 'o', kind: 'pole-shadow', shadowAzimuthDeg: 310, shadowAzimuthSigmaDeg: 3 }) },
  { name: 'pole both', data: obs({ id: 'o', kind: 'pole-shadow', shadowAzimuthDeg: 0, shadowAzimuthSigmaDeg: 3, lengthRatio: 1.5, lengthRatioSigma: 0.1 }) },
  { name: 'eave', data: obs({ id: 'o', kind: 'eave-shadow', wall: 'tanners-hall-front', distanceRatio: 0.5, sigma: 0.05 }) },
  { name: 'shadow points', data: obs({ id: 'o', kind: 'shadow-points', caster: [0, 0, 5], shadow: [2, -3, 0], sigmaM: 0.05 }) },
  { name: 'sun direction', data: obs({ id: 'o', kind: 'sun-direction', azimuthDeg: 200, azimuthSigmaDeg: 5, altitudeDeg: 30, altitudeSigmaDeg: 5 }) },
  { name: 'wall shaded', data: obs({ id: 'o', kind: 'wall-shaded', wall: 'tanners-hall-front' }) },
  { name: 'sun up', data: obs({ id: 'o', kind: 'sun-up' }) },
  { name: 'clock 24 h zone', data: obs({ id: 'o', kind: 'clock', reading: '19:05', precisionMinutes: 2, dialHours: 24, kept: 'zone:Europe/Zurich', hourHandTrusted: false }) },
  { name: 'clock meridian', data: obs({ id: 'o', kind: 'clock', reading: '12:30', precisionMinutes: 2, kept: 'meridian:9.35' }) },
  {
    name: 'camera block and object-shadow pairs',
    data: variant({
      image: IMAGE,
      camera: {
        verticalLines: [[[100, 100], [102, 800]], [[700, 90], [699, 820], [698, 850]]],
        wallLines: [{ wall: 'tanners-hall-front', lines: [[[100, 200], [600, 260]], [[100, 500], [600, 480]]] }],
        focalLengthPx: 1500,
        sigmaPx: 1.5,
      },
      'observations.0': { id: 'o', kind: 'object-shadow', objectPx: [400, 300], shadowPx: [420, 700], sigmaPx: 2, group: 'figures' },
    }),
  },
  {
    name: 'overhang through the camera, with its tip point',
    data: variant({
      image: IMAGE,
      camera: SAMPLE_CAMERA,
      'observations.0': { id: 'o', kind: 'overhang-shadow', wall: 'tanners-hall-front', pixels: { fromPx: [300, 300], toPx: [300, 350], tipPx: [320, 310] } },
    }),
  },
  {
    name: 'camera block and a shadow wedge',
    data: variant({
      image: IMAGE,
      camera: SAMPLE_CAMERA,
      'observations.0': { id: 'o', kind: 'shadow-wedge', shadowPx: [420, 700], edgesPx: [[380, 300], [460, 310]], sigmaPx: 2, group: 'figures' },
    }),
  },
  {
    name: 'pixel rod on a wall plane',
    data: variant({ image: IMAGE, 'walls.0.imagePlane': WALL_PLANE, 'observations.0': { id: 'o', kind: 'rod-shadow', wall: 'tanners-hall-front', pixels: { fromPx: [300, 300], toPx: [250, 350], sigmaPx: 2 } } }),
  },
  {
    name: 'pixel overhang, plane by points',
    data: variant({
      image: { ...IMAGE, mirrored: true, file: 'print.PNG' },
      'walls.0.imagePlane': { pointsPx: [[100, 100], [900, 120], [880, 900], [110, 880], [500, 500]], planePointsM: [[0, 7], [8, 7], [8, 0], [0, 0], [4, 3.5]], pointSigmaPx: [1, 1, 1, 1, 2] },
      'observations.0': { id: 'o', kind: 'overhang-shadow', wall: 'tanners-hall-front', pixels: { fromPx: [300, 300], toPx: [300, 350], projectionM: 0.6, projectionSigmaM: 0.05 } },
    }),
  },
  {
    name: 'pixel pole on the ground, aspect rectangle',
    data: variant({
      image: IMAGE,
      groundPlane: { pointsPx: [[100, 1000], [1900, 1000], [1990, 1400], [10, 1400]], aspect: 3, firstEdgeAzimuthDeg: 90 },
      'observations.0': { id: 'o', kind: 'pole-shadow', pixels: { fromPx: [500, 1200], toPx: [700, 1300] } },
    }),
  },
  { name: 'pixel pole on the ground from two walls', data: fromWallsScene({ walls: ['tanners-hall-front', 'tanners-hall-side'], cornerPx: [1000, 1100], cornerSigmaPx: 2 }) },
];

/** Two walls meeting at a corner, each with a window of known size, and the ground fixed by their foot lines. */
function fromWallsScene(fromWalls: unknown, sidePlane: unknown = { pointsPx: [[1100, 300], [1800, 200], [1780, 900], [1120, 880]], widthM: 6, heightM: 5 }): Data {
  return variant({
    image: IMAGE,
    'walls.0.imagePlane': WALL_PLANE,
    'walls.1': { id: 'tanners-hall-side', azimuthDeg: 172, azimuthSigmaDeg: 1, imagePlane: sidePlane },
    groundPlane: { fromWalls },
    'observations.0': { id: 'o', kind: 'pole-shadow', pixels: { fromPx: [500, 1200], toPx: [700, 1300] } },
  });
}

/** Invalid scenes: the path the reader must name, a fragment of its message, and whether the schema alone sees it. */
export interface BadScene {
  readonly name: string;
  readonly data: unknown;
  readonly field: string;
  readonly says: RegExp;
  readonly schemaSees: boolean;
}

const o0 = 'observations[0]';
export const BAD_SCENES: readonly BadScene[] = [
  { name: 'not a map', data: [1, 2], field: 'the scene', says: /a map of keys/, schemaSees: true },
  {
    name: 'object-shadow without a camera',
    data: variant({ image: IMAGE, 'observations.0': { id: 'o', kind: 'object-shadow', objectPx: [400, 300], shadowPx: [420, 700] } }),
    field: 'observations[0].kind', says: /only when the scene has a "camera" block/, schemaSees: false,
  },
  {
    name: 'overhang with both tipPx and projectionM',
    data: variant({
      image: IMAGE,
      camera: SAMPLE_CAMERA,
      'observations.0': { id: 'o', kind: 'overhang-shadow', wall: 'tanners-hall-front', pixels: { fromPx: [300, 300], toPx: [300, 350], tipPx: [320, 310], projectionM: 0.5, projectionSigmaM: 0.01 } },
    }),
    field: 'observations[0].pixels.tipPx', says: /either tipPx .* or projectionM/, schemaSees: true,
  },
  {
    name: 'shadow wedge with one edge point',
    data: variant({
      image: IMAGE,
      camera: SAMPLE_CAMERA,
      'observations.0': { id: 'o', kind: 'shadow-wedge', shadowPx: [420, 700], edgesPx: [[380, 300]] },
    }),
    field: 'observations[0].edgesPx', says: /two image points/, schemaSees: true,
  },
  {
    name: 'camera without wall lines',
    data: variant({ image: IMAGE, camera: { verticalLines: [[[100, 100], [102, 800]], [[700, 90], [699, 820]]] } }),
    field: 'camera.wallLines', says: /lines along the horizontal edges/, schemaSees: true,
  },
  { name: 'no version', data: variant({ heliochron: undefined }), field: 'heliochron', says: /start the file with "heliochron: 1"/, schemaSees: true },
  { name: 'version 2', data: variant({ heliochron: 2 }), field: 'heliochron', says: /format version 1/, schemaSees: true },
  { name: 'no title', data: variant({ title: undefined }), field: 'title', says: /title/, schemaSees: true },
  { name: 'blank title', data: variant({ title: '   ' }), field: 'title', says: /It is empty/, schemaSees: true },
  { name: 'latitude out of range', data: variant({ 'site.latitudeDeg': 95 }), field: 'site.latitudeDeg', says: /95 is not allowed; expected a latitude in degrees from -90 to 90, north positive/, schemaSees: true },
  { name: 'latitude with an east letter', data: variant({ 'site.latitudeDeg': '47.62 E' }), field: 'site.latitudeDeg', says: /E marks a longitude; a latitude takes N or S/, schemaSees: true },
  { name: 'longitude minutes over 59', data: variant({ 'site.longitudeDeg': "9°75'E" }), field: 'site.longitudeDeg', says: /Minutes and seconds run from 0 to 59/, schemaSees: false },
  { name: 'latitude NaN text', data: variant({ 'site.latitudeDeg': 'NaN' }), field: 'site.latitudeDeg', says: /Only finite numbers/, schemaSees: true },
  { name: 'latitude NaN number', data: variant({ 'site.latitudeDeg': Number.NaN }), field: 'site.latitudeDeg', says: /NaN is not allowed.*Only finite numbers/, schemaSees: true },
  { name: 'unit-less lat key', data: variant({ site: { lat: 47.6, longitudeDeg: 9.35 } }), field: 'site.lat', says: /Did you mean "latitudeDeg"\? Angles are in degrees/, schemaSees: true },
  { name: 'negative site sigma', data: variant({ 'site.latitudeSigmaDeg': -0.1 }), field: 'site.latitudeSigmaDeg', says: /, from 0 to 5/, schemaSees: true },
  { name: 'unknown top key', data: variant({ seeds: 3 }), field: 'seeds', says: /Did you mean "seed"\?/, schemaSees: true },
  { name: 'unknown calendar', data: variant({ calendar: 'gregorain' }), field: 'calendar', says: /Did you mean "gregorian"\?/, schemaSees: false },
  { name: 'unknown region', data: variant({ calendar: 'protestant-germani' }), field: 'calendar', says: /protestant-germany/, schemaSees: false },
  { name: 'switch days not consecutive', data: variant({ calendar: { lastJulian: '1700-02-18', firstGregorian: '1700-03-02' } }), field: 'calendar', says: /not consecutive/, schemaSees: false },
  { name: 'bad year start', data: variant({ yearStart: 'march25' }), field: 'yearStart', says: /one of "jan1"/, schemaSees: true },
  { name: 'window reversed', data: variant({ window: { fromYear: 1750, toYear: 1700 } }), field: 'window.toYear', says: /not before fromYear \(1750\)/, schemaSees: false },
  { name: 'window year fraction', data: variant({ 'window.fromYear': 1700.5 }), field: 'window.fromYear', says: /whole number/, schemaSees: true },
  { name: 'date in the Gregorian gap', data: variant({ calendar: 'protestant-germany', window: { fromYear: 1690, toYear: 1710, notBefore: '1700-02-25' } }), field: 'window.notBefore', says: /never used|does not exist/, schemaSees: false },
  { name: 'notAfter before notBefore', data: variant({ window: { fromYear: 1700, toYear: 1750, notBefore: '1720-01-01', notAfter: '1710-01-01' } }), field: 'window.notAfter', says: /not before notBefore/, schemaSees: false },
  { name: 'month 13', data: variant({ 'window.months': [5, 13] }), field: 'window.months[1]', says: /1 to 12/, schemaSees: true },
  { name: 'month name capitalised', data: variant({ 'window.months': ['May'] }), field: 'window.months[0]', says: /Did you mean "may"\?/, schemaSees: true },
  { name: 'weekday typo', data: variant({ 'window.weekday': 'sonday' }), field: 'window.weekday', says: /Did you mean "sunday"\?/, schemaSees: true },
  { name: 'air pressure in Pa', data: variant({ air: { pressurePa: 96000 } }), field: 'air.pressurePa', says: /Did you mean "pressureHPa"\? Pressure is in hectopascals/, schemaSees: true },
  { name: 'wall azimuth in radians', data: variant({ 'walls.0': { id: 'tanners-hall-front', azimuthRad: 4.57, azimuthSigmaDeg: 1 } }), field: 'walls[0].azimuthRad', says: /Did you mean "azimuthDeg"\? Angles are in degrees/, schemaSees: true },
  { name: 'wall azimuth 360', data: variant({ 'walls.0.azimuthDeg': 360 }), field: 'walls[0].azimuthDeg', says: /360 excluded/, schemaSees: true },
  { name: 'wall with two forms', data: variant({ 'walls.0.mapAzimuthDeg': 10 }), field: 'walls[0].mapAzimuthDeg', says: /exactly one of "azimuthDeg", "mapAzimuthDeg", "mapPoints"/, schemaSees: true },
  { name: 'wall without sigma', data: variant({ 'walls.0.azimuthSigmaDeg': undefined }), field: 'walls[0].azimuthSigmaDeg', says: /a sigma in degrees/, schemaSees: true },
  { name: 'wall sigma mistyped', data: variant({ 'walls.0': { id: 'tanners-hall-front', azimuthDeg: 262, azimuthSigmDeg: 1.5 } }), field: 'walls[0].azimuthSigmDeg', says: /Did you mean "azimuthSigmaDeg"\?/, schemaSees: true },
  { name: 'map points coincide', data: variant({ 'walls.0': { id: 'tanners-hall-front', mapPoints: { fromM: [1, 1], toM: [1, 1.05], outward: 'left' }, azimuthSigmaDeg: 1 } }), field: 'walls[0].mapPoints.toM', says: /at least 0.1 m from fromM/, schemaSees: false },
  { name: 'duplicate wall id', data: variant({ 'walls.1': { id: 'tanners-hall-front', azimuthDeg: 10, azimuthSigmaDeg: 1 } }), field: 'walls[1].id', says: /walls\[0\] has it already/, schemaSees: false },
  { name: 'bad id', data: variant({ 'walls.0.id': 'Tanners Hall' }), field: 'walls[0].id', says: /an id of letters/, schemaSees: true },
  { name: 'no observations', data: variant({ observations: [] }), field: 'observations', says: /1 to 1000 items/, schemaSees: true },
  { name: 'unknown kind', data: variant({ 'observations.0.kind': 'rod-shadows' }), field: `${o0}.kind`, says: /one of rod-shadow|Did you mean "rod-shadow"/, schemaSees: true },
  { name: 'unknown wall', data: variant({ 'observations.0.wall': 'tanners-hal-front' }), field: `${o0}.wall`, says: /the id of a wall of this scene: "tanners-hall-front".*Did you mean "tanners-hall-front"/, schemaSees: false },
  { name: 'slope without unit', data: variant({ 'observations.0': { id: 'b', kind: 'rod-shadow', wall: 'tanners-hall-front', slope: 38, side: 'left', sigmaDeg: 2 } }), field: `${o0}.slope`, says: /Did you mean "slopeDeg"\? Angles are in degrees/, schemaSees: true },
  { name: 'slope 90', data: variant({ 'observations.0.slopeDeg': 90 }), field: `${o0}.slopeDeg`, says: /0 and 90 excluded/, schemaSees: true },
  { name: 'negative sigma', data: variant({ 'observations.0.sigmaDeg': -2 }), field: `${o0}.sigmaDeg`, says: /a sigma in degrees, from 0.000001 to 45/, schemaSees: true },
  // A sigma far below any measurement on a picture would make chi-square overflow (src/scene/fields.ts SIGMA_FLOOR).
  { name: 'vanishing sigma', data: variant({ 'observations.0.sigmaDeg': 4.2e-221 }), field: `${o0}.sigmaDeg`, says: /from 0.000001 to 45/, schemaSees: true },
  { name: 'vanishing wall sigma', data: variant({ 'walls.0.azimuthSigmaDeg': 1e-12 }), field: 'walls[0].azimuthSigmaDeg', says: /either 0 or at least 0.000001/, schemaSees: true },
  { name: 'missing sigma', data: variant({ 'observations.0.sigmaDeg': undefined }), field: `${o0}.sigmaDeg`, says: /needs "sigmaDeg"/, schemaSees: true },
  { name: 'sigma mistyped', data: variant({ 'observations.0.sigmDeg': 2, 'observations.0.sigmaDeg': undefined }), field: `${o0}.sigmDeg`, says: /Did you mean "sigmaDeg"\?/, schemaSees: true },
  { name: 'side typo', data: variant({ 'observations.0.side': 'lft' }), field: `${o0}.side`, says: /Did you mean "left"\?/, schemaSees: true },
  { name: 'duplicate observation id', data: variant({ 'observations.1': { id: 'bracket', kind: 'sun-up' } }), field: 'observations[1].id', says: /observations\[0\] has it already/, schemaSees: false },
  { name: 'numbers and pixels', data: variant({ image: IMAGE, 'walls.0.imagePlane': WALL_PLANE, 'observations.0.pixels': { fromPx: [1, 1], toPx: [2, 2] } }), field: `${o0}.slopeDeg`, says: /not both/, schemaSees: true },
  { name: 'pixels without image', data: variant({ 'observations.0': { id: 'o', kind: 'rod-shadow', wall: 'tanners-hall-front', pixels: { fromPx: [1, 1], toPx: [2, 2] } } }), field: `${o0}.pixels`, says: /imagePlane|image/, schemaSees: false },
  { name: 'pixel point outside', data: variant({ image: IMAGE, 'walls.0.imagePlane': WALL_PLANE, 'observations.0': { id: 'o', kind: 'rod-shadow', wall: 'tanners-hall-front', pixels: { fromPx: [2100, 1], toPx: [2, 2] } } }), field: `${o0}.pixels.fromPx[0]`, says: /inside the image \(width 2000 px\)/, schemaSees: false },
  { name: 'plane with 3 points', data: variant({ image: IMAGE, 'walls.0.imagePlane': { pointsPx: [[1, 1], [5, 1], [5, 5]], widthM: 1, heightM: 1 } }), field: 'walls[0].imagePlane.pointsPx', says: /4 to 100 items/, schemaSees: true },
  { name: 'plane with two shapes', data: variant({ image: IMAGE, 'walls.0.imagePlane': { ...WALL_PLANE, aspect: 1.2 } }), field: 'walls[0].imagePlane.aspect', says: /exactly one of/, schemaSees: true },
  { name: 'rectangle with 5 points', data: variant({ image: IMAGE, 'walls.0.imagePlane': { pointsPx: [[1, 1], [5, 1], [5, 5], [1, 5], [3, 3]], widthM: 1, heightM: 1 } }), field: 'walls[0].imagePlane.pointsPx', says: /exactly 4 corners/, schemaSees: true },
  { name: 'zero rectangle width', data: variant({ image: IMAGE, 'walls.0.imagePlane': { ...WALL_PLANE, widthM: 0 } }), field: 'walls[0].imagePlane.widthM', says: /greater than 0|0 excluded/, schemaSees: true },
  { name: 'ground rectangle without azimuth', data: variant({ image: IMAGE, groundPlane: { pointsPx: WALL_PLANE.pointsPx, widthM: 3, heightM: 2 } }), field: 'groundPlane.firstEdgeAzimuthDeg', says: /first corner to the second/, schemaSees: true },
  { name: 'ground from walls and points', data: variant({ image: IMAGE, groundPlane: { pointsPx: WALL_PLANE.pointsPx, widthM: 3, heightM: 2, firstEdgeAzimuthDeg: 90, fromWalls: { walls: ['a', 'b'], cornerPx: [1, 1] } } }), field: 'groundPlane.fromWalls', says: /not both/, schemaSees: true },
  { name: 'ground from one wall', data: fromWallsScene({ walls: ['tanners-hall-front'], cornerPx: [1000, 1100] }), field: 'groundPlane.fromWalls.walls', says: /exactly 2 items/, schemaSees: true },
  { name: 'ground from an unknown wall', data: fromWallsScene({ walls: ['tanners-hall-front', 'tanners-hall-back'], cornerPx: [1000, 1100] }), field: 'groundPlane.fromWalls.walls[1]', says: /"tanners-hall-front", "tanners-hall-side"/, schemaSees: false },
  { name: 'ground from a wall of known aspect only', data: fromWallsScene({ walls: ['tanners-hall-front', 'tanners-hall-side'], cornerPx: [1000, 1100] }, { pointsPx: [[1100, 300], [1800, 200], [1780, 900], [1120, 880]], aspect: 1.2 }), field: 'walls[1].imagePlane.aspect', says: /in metres/, schemaSees: false },
  { name: 'ground corner outside the picture', data: fromWallsScene({ walls: ['tanners-hall-front', 'tanners-hall-side'], cornerPx: [1000, 1600] }), field: 'groundPlane.fromWalls.cornerPx[1]', says: /inside the image/, schemaSees: false },
  { name: 'image size zero', data: variant({ image: { widthPx: 0, heightPx: 10 } }), field: 'image.widthPx', says: /from 1 to 100000/, schemaSees: true },
  { name: 'image file not a picture', data: variant({ image: { ...IMAGE, file: 'print.tiff' } }), field: 'image.file', says: /JPEG or PNG/, schemaSees: true },
  { name: 'clock reading as number', data: obs({ id: 'c', kind: 'clock', reading: 7.4, precisionMinutes: 5 }), field: `${o0}.reading`, says: /with quotes/, schemaSees: true },
  { name: 'clock 13:00 on a 12-hour dial', data: obs({ id: 'c', kind: 'clock', reading: '13:00', precisionMinutes: 5 }), field: `${o0}.reading`, says: /12-hour dial/, schemaSees: false },
  { name: 'clock dial 10', data: obs({ id: 'c', kind: 'clock', reading: '7:40', precisionMinutes: 5, dialHours: 10 }), field: `${o0}.dialHours`, says: /12 or 24/, schemaSees: true },
  { name: 'clock dial without unit', data: obs({ id: 'c', kind: 'clock', reading: '7:40', precisionMinutes: 5, dial: 12 }), field: `${o0}.dial`, says: /Did you mean "dialHours"\?/, schemaSees: true },
  { name: 'clock kept unknown word', data: obs({ id: 'c', kind: 'clock', reading: '7:40', precisionMinutes: 5, kept: 'sundial' }), field: `${o0}.kept`, says: /apparent, mean/, schemaSees: false },
  { name: 'pole with half a pair', data: obs({ id: 'p', kind: 'pole-shadow', lengthRatio: 1.2 }), field: `${o0}.lengthRatioSigma`, says: /given together/, schemaSees: true },
  { name: 'pole with nothing', data: obs({ id: 'p', kind: 'pole-shadow' }), field: `${o0}.shadowAzimuthDeg`, says: /both, or "pixels"/, schemaSees: true },
  { name: 'shadow above caster', data: obs({ id: 's', kind: 'shadow-points', caster: [0, 0, 1], shadow: [1, 1, 2], sigmaM: 0.1 }), field: `${o0}.shadow`, says: /lower than the caster/, schemaSees: false },
  { name: 'sun altitude 91', data: obs({ id: 's', kind: 'sun-direction', azimuthDeg: 1, azimuthSigmaDeg: 1, altitudeDeg: 91, altitudeSigmaDeg: 1 }), field: `${o0}.altitudeDeg`, says: /from -1 to 90/, schemaSees: true },
  { name: 'seed negative', data: variant({ seed: -1 }), field: 'seed', says: /whole number/, schemaSees: true },
  { name: 'very long title', data: variant({ title: 'x'.repeat(501) }), field: 'title', says: /It has 501 characters/, schemaSees: true },
];

/**
 * The scene of bench/solver-window.mjs (also used by bench/solver-growth.mjs): Velmar (47.62 N,
 * 9.35 E), two rod shadows on walls of azimuth 160 and 100 deg and one pole shadow (three
 * observations, four numbers), forward-computed with the full ephemeris at 1650-09-12 09:00:22
 * local mean time (synthetic truth); window 1400-1899.
 */
import { sunPosition } from '../dist/ephemeris/sunPosition.js';
import { civilDateToJd } from '../dist/calendar/regions.js';
import { predictRodShadow } from '../dist/geometry/wallShadows.js';
import { predictPoleShadow } from '../dist/geometry/groundShadows.js';

export const site = { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410, latitudeSigmaDeg: 0, longitudeSigmaDeg: 0 };
const walls = [
  { id: 'tanners-hall', azimuthDeg: 160, azimuthSigmaDeg: 0, azimuthSource: 'synthetic' },
  { id: 'gate-tower', azimuthDeg: 100, azimuthSigmaDeg: 0, azimuthSource: 'synthetic' },
];
export const dayJd0 = civilDateToJd({ kind: 'gregorian' }, { year: 1650, month: 9, day: 12 });
export const truthJdUT = dayJd0 + (9 * 60 + 22 / 60 - 4 * site.longitudeDeg) / 1440; // 09:00:22 local mean time, off the scan's minute grid
const sun = sunPosition(truthJdUT, site);
const rodA = predictRodShadow(sun, 160);
const rodB = predictRodShadow(sun, 100);
const pole = predictPoleShadow(sun);
export const benchScene = {
  formatVersion: 1,
  title: 'Velmar, the Marktgasse view (bench)',
  site,
  calendar: { kind: 'gregorian' },
  yearStart: 'jan1',
  window: { fromYear: 1400, toYear: 1899 },
  mapNorthCorrectionDeg: 0,
  walls,
  observations: [
    { id: 'bracket', kind: 'rod-shadow', wallId: 'tanners-hall', slopeDeg: rodA.slopeDeg, side: rodA.side, sigmaDeg: 0.5 },
    { id: 'sign-arm', kind: 'rod-shadow', wallId: 'gate-tower', slopeDeg: rodB.slopeDeg, side: rodB.side, sigmaDeg: 0.5 },
    { id: 'well-post', kind: 'pole-shadow', shadowAzimuthDeg: pole.shadowAzimuthDeg, shadowAzimuthSigmaDeg: 1, lengthRatio: pole.lengthRatio, lengthRatioSigma: 0.05 },
  ],
  seed: 1,
};


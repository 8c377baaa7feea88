import { it } from 'vitest';
import { solveDates } from '../../src/solver/solveDates.js';
import { checkProposal } from '../../src/solver/checkDate.js';
import { dateAnswerJson, stableJson } from '../../src/report/json.js';
import { renderDateText } from '../../src/report/text.js';
import { sceneOf, velmar, nonFinitePaths } from './robustHelpers.js';
import { sunPosition } from '../../src/ephemeris/sunPosition.js';
import { calendarDateToJd } from '../../src/calendar/julianDay.js';

function sunAt(lat: number, lon: number, y: number, m: number, d: number, utH: number) {
  const jdUT = calendarDateToJd({ calendar: 'gregorian', year: y, month: m, day: d }, utH / 24);
  return sunPosition(jdUT, { latitudeDeg: lat, longitudeDeg: lon, elevationM: 0 });
}
function run(name: string, data: any) {
  const t = performance.now();
  let out = '';
  try {
    const s = sceneOf(data);
    const a = solveDates(s);
    const j = dateAnswerJson(a, s, 'x');
    const bad = nonFinitePaths(j);
    const c = a.candidates[0];
    out = `${a.status} | nonfinite ${bad.slice(0,5).join(',')} | ${a.verdict.slice(0, 400)}${c ? ` | sun az ${c.sun.azimuthDeg.toFixed(2)} alt ${c.sun.altitudeDeg.toFixed(2)} unc ${c.uncertainty.method} ${c.uncertainty.invalidReason ?? ''}` : ''}`;
    const txt = renderDateText(a, s);
    if (/NaN|Infinity|undefined/.test(txt)) out += ' TEXT-HAS-NaN: ' + (txt.match(/.*(NaN|Infinity|undefined).*/)?.[0] ?? '');
  } catch (e) { out = `THROW ${(e as Error).constructor.name}: ${(e as Error).message.slice(0, 300)}\n${(e as Error).stack?.split('\n').slice(1,4).join('\n')}`; }
  console.log(`${name} [${(performance.now()-t).toFixed(0)} ms]: ${out}`);
}
it('probe', () => {
  // polar day 78N midnight June 21 1900, lon 15 -> local midnight UT = -1h
  let p = sunAt(78, 15, 1900, 6, 21, 23);
  console.log('78N midnight', p.azimuthDeg, p.altitudeDeg);
  run('polar day 78N', velmar({ site: { latitudeDeg: 78, longitudeDeg: 15 }, window: { fromYear: 1900, toYear: 1905 }, walls: [], observations: [
    { id: 'sun', kind: 'sun-direction', azimuthDeg: +p.azimuthDeg.toFixed(2), azimuthSigmaDeg: 1, altitudeDeg: +p.altitudeDeg.toFixed(2), altitudeSigmaDeg: 0.3 }] }));
  run('polar night 78N', velmar({ site: { latitudeDeg: 78, longitudeDeg: 15 }, window: { fromYear: 1900, toYear: 1905, months: [12, 1] }, walls: [{ id: 'south-front', azimuthDeg: 180, azimuthSigmaDeg: 1 }], observations: [
    { id: 'lit', kind: 'wall-lit', wall: 'south-front' }, { id: 'bracket', kind: 'rod-shadow', wall: 'south-front', slopeDeg: 30, side: 'left', sigmaDeg: 2 }] }));
  p = sunAt(-70, 0, 1900, 12, 21, 0);
  console.log('70S midnight', p.azimuthDeg, p.altitudeDeg);
  run('polar day 70S', velmar({ site: { latitudeDeg: -70, longitudeDeg: 0 }, window: { fromYear: 1900, toYear: 1905 }, walls: [], observations: [
    { id: 'post', kind: 'pole-shadow', shadowAzimuthDeg: +((p.azimuthDeg + 180) % 360).toFixed(2), shadowAzimuthSigmaDeg: 2, lengthRatio: +(1/Math.tan(p.altitudeDeg*Math.PI/180)).toFixed(3), lengthRatioSigma: 0.5 }] }));
  run('polar night 70S', velmar({ site: { latitudeDeg: -70, longitudeDeg: 0 }, window: { fromYear: 1900, toYear: 1905, months: [6] }, walls: [{ id: 'north-front', azimuthDeg: 0, azimuthSigmaDeg: 1 }], observations: [
    { id: 'lit', kind: 'wall-lit', wall: 'north-front' }] }));
  p = sunAt(0, 0, 1900, 3, 21, 12);
  console.log('equator noon equinox', p.azimuthDeg, p.altitudeDeg);
  run('equator zenith pole', velmar({ site: { latitudeDeg: 0, longitudeDeg: 0 }, window: { fromYear: 1900, toYear: 1905 }, walls: [], observations: [
    { id: 'post', kind: 'pole-shadow', lengthRatio: 0.01, lengthRatioSigma: 0.01 }] }));
  run('equator zenith pole with azimuth', velmar({ site: { latitudeDeg: 0, longitudeDeg: 0 }, window: { fromYear: 1900, toYear: 1905 }, walls: [], observations: [
    { id: 'post', kind: 'pole-shadow', shadowAzimuthDeg: 90, shadowAzimuthSigmaDeg: 5, lengthRatio: 0.0, lengthRatioSigma: 0.01 }] }));
  run('equator sun dir zenith', velmar({ site: { latitudeDeg: 0, longitudeDeg: 0 }, window: { fromYear: 1900, toYear: 1905 }, walls: [], observations: [
    { id: 'sun', kind: 'sun-direction', azimuthDeg: 0, azimuthSigmaDeg: 5, altitudeDeg: 89.9, altitudeSigmaDeg: 0.2 }] }));
  run('subsolar 23.44N', velmar({ site: { latitudeDeg: 23.44, longitudeDeg: 0 }, window: { fromYear: 1900, toYear: 1900, notBefore: '1900-06-10', notAfter: '1900-07-01' }, walls: [], observations: [
    { id: 'post', kind: 'pole-shadow', lengthRatio: 0, lengthRatioSigma: 0.005 }] }));
  run('subsolar 23.44N azimuth', velmar({ site: { latitudeDeg: 23.44, longitudeDeg: 0 }, window: { fromYear: 1900, toYear: 1900 }, walls: [], observations: [
    { id: 'post', kind: 'pole-shadow', shadowAzimuthDeg: 0, shadowAzimuthSigmaDeg: 3, lengthRatio: 0, lengthRatioSigma: 0.005 }] }));
  run('grazed wall fin', velmar({ walls: [{ id: 'w', azimuthDeg: 180, azimuthSigmaDeg: 0.5 }], observations: [
    { id: 'fin', kind: 'fin-shadow', wall: 'w', widthRatio: 40, side: 'left', sigma: 5 }, { id: 'lit', kind: 'wall-lit', wall: 'w' }] }));
  run('grazed wall overhang', velmar({ walls: [{ id: 'w', azimuthDeg: 180, azimuthSigmaDeg: 0.5 }], observations: [
    { id: 'oh', kind: 'overhang-shadow', wall: 'w', depthRatio: 30, sigma: 3 }] }));
  run('grazed rod slope', velmar({ walls: [{ id: 'w', azimuthDeg: 180, azimuthSigmaDeg: 0.5 }], observations: [
    { id: 'rod', kind: 'rod-shadow', wall: 'w', slopeDeg: 0.5, side: 'left', sigmaDeg: 0.3 }] }));
  run('rod slope 89.9', velmar({ walls: [{ id: 'w', azimuthDeg: 180, azimuthSigmaDeg: 0.5 }], observations: [
    { id: 'rod', kind: 'rod-shadow', wall: 'w', slopeDeg: 89.9, side: 'left', sigmaDeg: 0.5 }] }));
  run('impossible alt', velmar({ site: { latitudeDeg: 60, longitudeDeg: 10 }, walls: [], observations: [
    { id: 'sun', kind: 'sun-direction', azimuthDeg: 180, azimuthSigmaDeg: 2, altitudeDeg: 80, altitudeSigmaDeg: 1 }] }));
  run('north wall lit at noon', velmar({ walls: [{ id: 'w', azimuthDeg: 0, azimuthSigmaDeg: 0.5 }], observations: [
    { id: 'lit', kind: 'wall-lit', wall: 'w' }, { id: 'pole', kind: 'pole-shadow', shadowAzimuthDeg: 0, shadowAzimuthSigmaDeg: 2 }] }));
  run('one day window', velmar({ window: { fromYear: 1765, toYear: 1765, notBefore: '1765-07-30', notAfter: '1765-07-30' } }));
  run('southern site', velmar({ site: { latitudeDeg: -33.9, longitudeDeg: 18.4 }, walls: [{ id: 'w', azimuthDeg: 0, azimuthSigmaDeg: 1 }], observations: [
    { id: 'rod', kind: 'rod-shadow', wall: 'w', slopeDeg: 40, side: 'right', sigmaDeg: 1 }, { id: 'pole', kind: 'pole-shadow', shadowAzimuthDeg: 200, shadowAzimuthSigmaDeg: 2, lengthRatio: 0.8, lengthRatioSigma: 0.05 }] }));
  run('3000 years', velmar({ calendar: 'julian', window: { fromYear: -999, toYear: 2000 } }));
  run('3000 years clock', velmar({ calendar: 'great-britain', yearStart: 'jan1', window: { fromYear: -999, toYear: 2000 }, observations: [
    { id: 'rod', kind: 'rod-shadow', wall: 'tanners-hall-front', slopeDeg: 49, side: 'left', sigmaDeg: 1.5 }, { id: 'c', kind: 'clock', reading: '8:06', precisionMinutes: 2, kept: 'unknown' }] }));
});

#!/usr/bin/env node
/**
 * Build data/tz-history.json: the offsets of every IANA time zone before 1970, from the compiled
 * zone files of a tz database built WITH its `backzone` file (Debian's tzdata package is: its
 * /usr/share/zoneinfo/tzdata.zi starts "# ddeps backzone"). Node's own ICU data merges zones that
 * agree since 1970, so before 1970 heliochron reads zone offsets from this file instead.
 *
 * Usage: node scripts/build-tz-history.mjs [zoneinfo directory, default /usr/share/zoneinfo]
 * Reads the binary zone files (TZif, RFC 8536: version 2+ data block, 64-bit transition times);
 * keeps the transitions before 1970-01-01 and the offset before the first one. Run it again when
 * the tz database changes; the file names the version it was built from.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

const dir = process.argv[2] ?? '/usr/share/zoneinfo';
const zi = readFileSync(join(dir, 'tzdata.zi'), 'utf8');
const version = /^# version (\S+)/m.exec(zi)?.[1];
if (!version) throw new Error(`${dir}/tzdata.zi: no "# version" line`);
if (!/^# ddeps .*backzone/m.test(zi)) throw new Error(`${dir}/tzdata.zi was not built with backzone: its pre-1970 history would be merged`);
// Zone names ("Z name ...") and link names ("L target name") of the source file.
const names = [];
for (const line of zi.split('\n')) {
  const z = /^Z (\S+)/.exec(line);
  if (z) names.push(z[1]);
  const l = /^L \S+ (\S+)/.exec(line);
  if (l) names.push(l[1]);
}

/** Parse a TZif file: offsets (seconds east of UT) of type 0 and of each transition before 1970. */
function readTzif(buffer) {
  if (buffer.toString('latin1', 0, 4) !== 'TZif') throw new Error('not a TZif file');
  const counts = (at) => [20, 24, 28, 32, 36, 40].map((o) => buffer.readUInt32BE(at + o));
  // RFC 8536 sec. 3.1: isutcnt, isstdcnt, leapcnt, timecnt, typecnt, charcnt.
  let [isut, isstd, leap, timecnt, typecnt, charcnt] = counts(0);
  if (buffer[4] < 0x32) throw new Error('version 1 TZif file: no 64-bit data');
  const v1Size = timecnt * 4 + timecnt + typecnt * 6 + charcnt + leap * 8 + isstd + isut;
  const h2 = 44 + v1Size;
  [isut, isstd, leap, timecnt, typecnt, charcnt] = counts(h2);
  let p = h2 + 44;
  const times = [];
  for (let i = 0; i < timecnt; i += 1) times.push(Number(buffer.readBigInt64BE(p + 8 * i)));
  p += 8 * timecnt;
  const idx = [...buffer.subarray(p, p + timecnt)];
  p += timecnt;
  const types = [];
  for (let i = 0; i < typecnt; i += 1) types.push({ utoff: buffer.readInt32BE(p + 6 * i), isdst: buffer[p + 6 * i + 4] });
  const transitions = [];
  for (let i = 0; i < timecnt; i += 1) if (times[i] < 0) transitions.push([times[i], types[idx[i]].utoff, types[idx[i]].isdst]);
  return { before: types[0].utoff, transitions };
}

const zones = {};
for (const name of names.sort()) {
  try {
    zones[name] = readTzif(readFileSync(join(dir, name)));
  } catch (error) {
    process.stderr.write(`skipped ${name}: ${error.message}\n`);
  }
}
const out = {
  about:
    'Offsets of IANA time zones before 1970 (seconds east of UT), built by scripts/build-tz-history.mjs from the compiled ' +
    'tz database of the machine, which includes the backzone file. before: the offset before the first transition ' +
    '(the local mean time of the zone\'s reference place); transitions: [unix seconds, offset from then on, 1 if summer time].',
  version,
  builtFrom: `${dir} (tzdata.zi: version ${version}, with backzone)`,
  zones,
};
writeFileSync(new URL('../data/tz-history.json', import.meta.url), `${JSON.stringify(out)}\n`);
process.stdout.write(`tz ${version}: ${Object.keys(zones).length} zones written to data/tz-history.json\n`);

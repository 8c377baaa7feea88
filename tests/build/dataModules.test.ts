/**
 * The data tables reach the library as generated modules (scripts/build-data-modules.mjs), each the
 * exact text of its file in data/, the single source of truth. A module left behind after an edit
 * of its data file fails here.
 */
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { CALENDAR_REFORMS_JSON } from '../../src/calendar/calendarReformsJson.generated.js';
import { TZ_HISTORY_JSON } from '../../src/time/tzHistoryJson.generated.js';
import { loadReformTable } from '../../src/calendar/regions.js';
import { historyTzVersion } from '../../src/time/zoneHistory.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const dataText = (name: string): string => readFileSync(`${ROOT}data/${name}`, 'utf8');

describe('the generated data modules', () => {
  it('hold the exact text of data/calendar-reforms.json and data/tz-history.json', () => {
    expect(CALENDAR_REFORMS_JSON).toBe(dataText('calendar-reforms.json'));
    expect(TZ_HISTORY_JSON).toBe(dataText('tz-history.json'));
  });

  it('are what the build script writes now (header included), so `--check` passes', () => {
    // Exits with 1 and names the module when one is stale; execFileSync throws on that.
    expect(() => execFileSync(process.execPath, [`${ROOT}scripts/build-data-modules.mjs`, '--check'], { stdio: 'pipe' })).not.toThrow();
  });

  it('give the library the same tables as the files', () => {
    const reforms = JSON.parse(dataText('calendar-reforms.json')) as { regions: { id: string }[] };
    expect(loadReformTable().map((r) => r.id)).toEqual(reforms.regions.map((r) => r.id));
    expect(historyTzVersion()).toBe((JSON.parse(dataText('tz-history.json')) as { version: string }).version);
  });
});

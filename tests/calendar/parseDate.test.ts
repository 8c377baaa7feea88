import { describe, expect, it } from 'vitest';
import { InvalidInputError } from '../../src/errors.js';
import { parseDateParts, parseDateText } from '../../src/calendar/parseDate.js';

// BC/AD to astronomical years: 1 BC = 0, 44 BC = -43 (Meeus (1998) ch. 7, p. 60).
describe('parseDateText', () => {
  it.each([
    ['1582-10-15', 1582, 10, 15],
    ['1582-1-5', 1582, 1, 5],
    ['-0043-03-15', -43, 3, 15],
    ['0000-01-01', 0, 1, 1],
    ['44-03-15 BC', -43, 3, 15],
    ['BC 44-03-15', -43, 3, 15],
    ['AD 1066-10-14', 1066, 10, 14],
    ['1066-10-14 AD', 1066, 10, 14],
    ['15 March 44 BC', -43, 3, 15],
    ['15 Mar 44 B.C.', -43, 3, 15],
    ['14 October AD 1066', 1066, 10, 14],
    ['March 15, 1066', 1066, 3, 15],
    ['1 BC-12-31', 0, 12, 31],
    ['44 BC-03-15', -43, 3, 15],
    ['15 Marc 44 BC', -43, 3, 15], // any leading part of a month name of three letters or more
    ['1700-02-29', 1700, 2, 29], // leap in the Julian calendar; the calendar decides later
    ['1712-02-30', 1712, 2, 30], // the Swedish 30 February (Brader 1996, IANA tz file `calendars`)
  ])('reads %s as year %i month %i day %i', (text, year, month, day) => {
    expect(parseDateText(text, '--date')).toEqual({ year, month, day });
  });

  it('reads a dual year as its January year and says so', () => {
    expect(parseDateParts('1650/1-02-10', 'date')).toEqual({ day: { year: 1651, month: 2, day: 10 }, dualYear: true, yearText: '1650/1' });
    expect(parseDateText('10 February 1650/1', 'date')).toEqual({ year: 1651, month: 2, day: 10 });
    expect(parseDateParts('1650-02-10', 'date').dualYear).toBe(false);
  });

  describe('edge cases: refusals name the field and quote the text, on one line', () => {
    it.each([
      ['1650-13-01', /Month 13 does not exist/],
      ['1650-02-30', /February has at most 29 days/],
      ['1650-04-31', /April has 30 days/],
      ['1650-01-32', /Day 32 does not exist/],
      ['1650-00-10', /Month 0 does not exist/],
      ['1650/01/10', /expected a date such as/],
      ['next tuesday', /expected a date such as/],
      ['', /expected a date such as/],
      ['0 BC-01-01', /no year 0 BC/],
      ['-44-03-15 BC', /no year 0 BC or AD/],
      ['15 Ma 44', /"Ma" is not a month name/],
      ['15 Foo 44', /"Foo" is not a month name/],
      ['1650/3-02-10', /does not read as 1651/],
    ])('refuses %j', (text, pattern) => {
      let error: unknown;
      try {
        parseDateText(text, 'window.notBefore');
      } catch (e) {
        error = e;
      }
      expect(error).toBeInstanceOf(InvalidInputError);
      const message = (error as InvalidInputError).message;
      expect(message).toMatch(pattern);
      expect(message.startsWith(`window.notBefore: ${JSON.stringify(text)}`)).toBe(true);
      expect(message).not.toContain('\n');
    });
  });
});

/**
 * The `--clock` option shared by `sun` and `check`: one default, stated in every --help.
 *
 * The default is local apparent time (the sundial's hour). Before the 19th century town clocks and
 * watches were set by sundials, so an hour written in a document or shown on a clock face of that
 * time is, unless the source says otherwise, an apparent-time hour; public mean time spread from the
 * late 18th century (docs/time-keeping.md, "What a clock kept"). The answers of `date` and `check`
 * also give every hour in local apparent time first. Light, loaded with the program.
 */

/** What --clock is when it is not given. */
export const CLOCK_DEFAULT = 'apparent';

/** Flags and help text of the option. */
export const CLOCK_FLAGS = '--clock <kind>';
export const CLOCK_KINDS_HELP =
  "'apparent' (local apparent time, the sundial's hour), 'mean' (local mean time), 'meridian:<deg>' (mean time of that " +
  "meridian, east positive), 'zone:<IANA name>' (e.g. zone:Europe/Zurich; from 1847 on, or local mean time where the " +
  "zone database starts with it), 'ut', or hours counted from sunset or sunrise: 'italian' (from sunset), 'italian+<min>' " +
  "(from sunset plus minutes), 'italian:dusk' (from the end of civil twilight), 'babylonian' (from sunrise), 'unequal' (temporal hours)";
/** Why the default is what it is, in the words of --help. */
export const CLOCK_DEFAULT_WHY = "local apparent time, the sundial's hour, which clocks kept until mean time spread in the late 18th and 19th centuries";

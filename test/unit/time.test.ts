import { strict as assert } from 'node:assert';
import {
  calendarToJd, deltaTSeconds, formatJd, instantFromCalendar, isoUtc, jdToCalendar, jdUt, validateCalendarDate, weekday,
} from '../../compute/time.js';

/** Calendar date with a fractional day, as Meeus writes them. */
function cd(year: number, month: number, dayFrac: number) {
  const day = Math.floor(dayFrac);
  const secs = Math.round((dayFrac - day) * 86400);
  return { year, month, day, hour: Math.floor(secs / 3600), minute: Math.floor((secs % 3600) / 60), second: secs % 60 };
}

describe('calendar dates and Julian Dates', () => {
  // Meeus, Astronomical Algorithms, 2nd ed. (1998), chapter 7: examples 7.a and 7.b and the
  // table of test dates that follows them (values transcribed from memory of the book; the
  // round trip below would expose a transcription slip only together with a code error).
  const cases: Array<[number, number, number, 'julian' | 'gregorian', number, string]> = [
    [1957, 10, 4.81, 'gregorian', 2436116.31, 'example 7.a'],
    [333, 1, 27.5, 'julian', 1842713.0, 'example 7.b'],
    [2000, 1, 1.5, 'gregorian', 2451545.0, 'table 7'],
    [1999, 1, 1.0, 'gregorian', 2451179.5, 'table 7'],
    [1987, 1, 27.0, 'gregorian', 2446822.5, 'table 7'],
    [1987, 6, 19.5, 'gregorian', 2446966.0, 'table 7'],
    [1988, 1, 27.0, 'gregorian', 2447187.5, 'table 7'],
    [1988, 6, 19.5, 'gregorian', 2447332.0, 'table 7'],
    [1900, 1, 1.0, 'gregorian', 2415020.5, 'table 7'],
    [1600, 1, 1.0, 'gregorian', 2305447.5, 'table 7'],
    [1600, 12, 31.0, 'gregorian', 2305812.5, 'table 7'],
    [837, 4, 10.3, 'julian', 2026871.8, 'table 7'],
    [-123, 12, 31.0, 'julian', 1676496.5, 'table 7'],
    [-122, 1, 1.0, 'julian', 1676497.5, 'table 7'],
    [-1000, 7, 12.5, 'julian', 1356001.0, 'table 7'],
    [-1000, 2, 29.0, 'julian', 1355866.5, 'table 7'],
    [-1001, 8, 17.9, 'julian', 1355671.4, 'table 7'],
    [-4712, 1, 1.5, 'julian', 0.0, 'table 7'],
  ];
  const toleranceDays = 1e-6;

  for (const [y, m, d, cal, jd, src] of cases) {
    it(`converts ${y}-${m}-${d} (${cal}) to JD ${jd} (Meeus 1998, ${src})`, () => {
      const got = calendarToJd(cd(y, m, d), cal);
      assert.ok(Math.abs(got - jd) < toleranceDays, `got ${got}`);
    });
    it(`converts JD ${jd} back to ${y}-${m}-${d} (${cal}) (Meeus 1998, examples 7.c/7.d method)`, () => {
      const back = jdToCalendar(jd, cal);
      assert.deepEqual([back.year, back.month, back.day], [y, m, Math.floor(d)]);
      const frac = (back.hour * 3600 + back.minute * 60 + back.second) / 86400;
      assert.ok(Math.abs(frac - (d - Math.floor(d))) < 1e-5, `day fraction ${frac}`);
    });
  }

  it('converts JD 1507900.13 to −584 May 28.63 in the Julian calendar (Meeus 1998, example 7.d)', () => {
    const c = jdToCalendar(1507900.13, 'julian');
    assert.deepEqual([c.year, c.month, c.day], [-584, 5, 28]);
    assert.ok(Math.abs((c.hour * 3600 + c.minute * 60 + c.second) / 86400 - 0.63) < 1e-5);
  });

  it('gives 1954 June 30 as a Wednesday (Meeus 1998, example 7.e)', () => {
    assert.equal(weekday(calendarToJd(cd(1954, 6, 30), 'gregorian')), 'Wednesday');
  });

  it('joins the calendars at the reform: Julian 1582-10-04 is followed by Gregorian 1582-10-15 (Meeus 1998, ch. 7)', () => {
    const last = instantFromCalendar(cd(1582, 10, 4), 'mixed');
    const first = instantFromCalendar(cd(1582, 10, 15), 'mixed');
    assert.equal(jdUt(first) - jdUt(last), 1);
    assert.match(validateCalendarDate(cd(1582, 10, 10), 'mixed') ?? '', /do not exist/);
    assert.equal(validateCalendarDate(cd(1582, 10, 10), 'gregorian'), undefined);
  });

  it('knows that 1900 is not a Gregorian leap year but is a Julian one (calendar rules, Meeus 1998 ch. 7)', () => {
    assert.match(validateCalendarDate(cd(1900, 2, 29), 'mixed') ?? '', /does not exist/);
    assert.equal(validateCalendarDate(cd(1300, 2, 29), 'mixed'), undefined);
    assert.equal(validateCalendarDate(cd(2000, 2, 29), 'mixed'), undefined);
  });

  it('round-trips random Julian Dates through both calendars to the millisecond (property, common practice)', () => {
    let worstMs = 0;
    for (let k = 0; k < 5000; k++) {
      const jd = -1e6 + ((k * 7919.123457) % 5e6);
      for (const cal of ['julian', 'gregorian'] as const) {
        const c = jdToCalendar(jd, cal);
        const back = calendarToJd(c, cal);
        worstMs = Math.max(worstMs, Math.abs(back - jd) * 86400000);
      }
    }
    assert.ok(worstMs <= 1, `worst round-trip error ${worstMs} ms`);
  });

  it('prints astronomical year numbering with year 0 and negative years', () => {
    assert.equal(formatJd(calendarToJd(cd(0, 1, 1), 'julian'), 'julian').slice(0, 10), '0000-01-01');
    assert.equal(formatJd(1356001.0, 'julian'), '-1000-07-12 12:00:00');
  });
});

describe('ΔT and time scales', () => {
  it('gives ΔT ≈ 63.8 s at 2000.0 (observed value 63.83 s, Espenak & Meeus 2006 / IERS; from memory)', () => {
    const dT = deltaTSeconds(0);
    assert.ok(Math.abs(dT - 63.83) < 0.5, `ΔT = ${dT}`);
  });
  it('gives ΔT ≈ 3 h around 500 BCE (Morrison & Stephenson 2004 scale: ≈ 17 190 s at −500; from memory)', () => {
    const i = instantFromCalendar(cd(-499, 1, 1), 'mixed');
    const dT = deltaTSeconds(i.ut);
    assert.ok(Math.abs(dT - 17190) < 600, `ΔT = ${dT}`);
  });
  it('writes ISO UTC text in the calendar of the date', () => {
    assert.equal(isoUtc(instantFromCalendar(cd(2020, 12, 21.5), 'mixed')), '2020-12-21T12:00:00Z');
    assert.equal(isoUtc(instantFromCalendar(cd(1000, 3, 1), 'mixed')), '1000-03-01T00:00:00Z');
  });
});

import {
  addCalendarDays,
  calendarDayNumber,
  daysBetween,
  dueVisits,
  isCalendarDate,
  isOutOfWindow,
  studyDay,
  visitScheduleStatus,
  windowDates,
  type PlannedVisitWindow,
} from './visit-schedule';

// Every expected number below was counted by hand on the Gregorian calendar and checked with
// Python's datetime (`(date(2024, 2, 29) - date(2024, 1, 31)).days` etc.), which is outside Gyre.

const BASELINE: PlannedVisitWindow = {
  id: 'pv-0',
  name: 'Baseline',
  targetDay: 0,
  windowBeforeDays: 0,
  windowAfterDays: 14,
};
const WEEK_12: PlannedVisitWindow = {
  id: 'pv-12',
  name: 'Week 12',
  targetDay: 84,
  windowBeforeDays: 14,
  windowAfterDays: 14,
};
const WEEK_26: PlannedVisitWindow = {
  id: 'pv-26',
  name: 'Week 26',
  targetDay: 182,
  windowBeforeDays: 14,
  windowAfterDays: 14,
};
const SCHEDULE = [WEEK_26, BASELINE, WEEK_12];
const ENROLLED = '2024-01-15';

describe('calendar dates', () => {
  it('knows real days from impossible ones, leap days included (Gregorian rule)', () => {
    expect(isCalendarDate('2024-02-29')).toBe(true); // 2024 divisible by 4
    expect(isCalendarDate('2000-02-29')).toBe(true); // divisible by 400
    expect(isCalendarDate('2025-02-29')).toBe(false);
    expect(isCalendarDate('2100-02-29')).toBe(false); // divisible by 100, not by 400
    expect(isCalendarDate('2026-04-31')).toBe(false);
    expect(isCalendarDate('2026-13-01')).toBe(false);
    expect(isCalendarDate('2026-1-01')).toBe(false);
    expect(calendarDayNumber('1970-01-02')).toBe(1);
  });

  it('counts days across month ends and leap days', () => {
    expect(daysBetween('2024-01-31', '2024-02-29')).toBe(29);
    expect(daysBetween('2024-02-28', '2024-03-01')).toBe(2); // through 29 February
    expect(daysBetween('2023-02-28', '2023-03-01')).toBe(1);
    expect(daysBetween('2023-12-31', '2024-12-31')).toBe(366);
    expect(daysBetween('2024-12-31', '2025-12-31')).toBe(365);
    expect(daysBetween('2024-03-31', '2025-03-31')).toBe(365);
    expect(studyDay('2024-03-01', '2024-02-29')).toBe(-1);
  });

  it('adds days across month ends and leap days', () => {
    expect(addCalendarDays('2024-01-31', 30)).toBe('2024-03-01');
    expect(addCalendarDays('2024-03-01', -1)).toBe('2024-02-29');
    expect(addCalendarDays('2025-01-31', 28)).toBe('2025-02-28');
    expect(addCalendarDays('2024-12-31', 1)).toBe('2025-01-01');
    expect(() => addCalendarDays('2025-02-29', 1)).toThrow(/not a calendar date/);
  });
});

describe('visitScheduleStatus', () => {
  it('opens and closes the Week 12 window on the right days', () => {
    // 2024-01-15 + 84 days = 2024-04-08 (through 29 February); ±14 days.
    expect(windowDates(WEEK_12, ENROLLED)).toEqual({
      opens: '2024-03-25',
      target: '2024-04-08',
      closes: '2024-04-22',
    });
  });

  it('is in window on both edges, early one day before, late one day after', () => {
    const status = (visitDate: string) =>
      visitScheduleStatus({ visitDate, enrolmentDate: ENROLLED, planned: WEEK_12 });
    expect(status('2024-04-08')).toMatchObject({ studyDay: 84, daysFromTarget: 0, window: 'in' });
    expect(status('2024-03-25')).toMatchObject({ studyDay: 70, window: 'in' });
    expect(status('2024-04-22')).toMatchObject({ studyDay: 98, window: 'in' });
    expect(status('2024-03-24')).toMatchObject({
      studyDay: 69,
      daysFromTarget: -15,
      window: 'early',
    });
    expect(status('2024-04-23')).toMatchObject({
      studyDay: 99,
      daysFromTarget: 15,
      window: 'late',
    });
    expect(status('2024-04-23')).toMatchObject({
      plannedVisitId: 'pv-12',
      plannedVisitName: 'Week 12',
      targetDay: 84,
    });
  });

  it('counts a visit on 29 February of a participant enrolled at a month end', () => {
    const planned = { ...WEEK_12, targetDay: 30, windowBeforeDays: 0, windowAfterDays: 0 };
    // 2024-01-30 + 30 days = 2024-02-29.
    expect(
      visitScheduleStatus({ visitDate: '2024-02-29', enrolmentDate: '2024-01-30', planned }),
    ).toMatchObject({ studyDay: 30, window: 'in' });
    expect(
      visitScheduleStatus({ visitDate: '2024-03-01', enrolmentDate: '2024-01-30', planned }),
    ).toMatchObject({ studyDay: 31, window: 'late' });
  });

  it('says unplanned without a planned visit and unknown without an enrolment date', () => {
    expect(
      visitScheduleStatus({ visitDate: '2024-04-08', enrolmentDate: ENROLLED, planned: null }),
    ).toEqual({
      plannedVisitId: null,
      plannedVisitName: null,
      studyDay: 84,
      targetDay: null,
      daysFromTarget: null,
      window: 'unplanned',
    });
    expect(
      visitScheduleStatus({ visitDate: '2024-04-08', enrolmentDate: null, planned: WEEK_12 }),
    ).toEqual({
      plannedVisitId: 'pv-12',
      plannedVisitName: 'Week 12',
      studyDay: null,
      targetDay: 84,
      daysFromTarget: null,
      window: 'unknown',
    });
  });

  it('marks only early and late as out of window', () => {
    expect(
      ['in', 'early', 'late', 'unplanned', 'unknown'].filter((w) => isOutOfWindow(w as never)),
    ).toEqual(['early', 'late']);
  });
});

describe('dueVisits', () => {
  const due = (asOf: string, done: string[]) =>
    dueVisits({ schedule: SCHEDULE, enrolmentDate: ENROLLED, done: new Set(done), asOf });

  it('lists the baseline as open on the enrolment day', () => {
    expect(due('2024-01-15', [])).toEqual([
      {
        plannedVisitId: 'pv-0',
        plannedVisitName: 'Baseline',
        targetDay: 0,
        opens: '2024-01-15',
        target: '2024-01-15',
        closes: '2024-01-29',
        status: 'open',
        daysOverdue: 0,
      },
    ]);
  });

  it('shows nothing before a window opens, open inside it, overdue after it', () => {
    expect(due('2024-03-24', ['pv-0'])).toEqual([]);
    expect(due('2024-03-25', ['pv-0'])).toMatchObject([
      { plannedVisitName: 'Week 12', status: 'open', daysOverdue: 0 },
    ]);
    expect(due('2024-04-22', ['pv-0'])).toMatchObject([{ status: 'open' }]);
    expect(due('2024-04-23', ['pv-0'])).toMatchObject([{ status: 'overdue', daysOverdue: 1 }]);
  });

  it('lists an overdue visit and the next open one together, by target day', () => {
    // Week 26: 2024-01-15 + 182 days = 2024-07-15, window 2024-07-01 … 2024-07-29.
    expect(due('2024-06-30', ['pv-0']).map((d) => d.plannedVisitName)).toEqual(['Week 12']);
    expect(due('2024-07-01', ['pv-0'])).toMatchObject([
      { plannedVisitName: 'Week 12', status: 'overdue', daysOverdue: 70 },
      { plannedVisitName: 'Week 26', status: 'open', opens: '2024-07-01', closes: '2024-07-29' },
    ]);
  });

  it('treats a visit passed over by a later one as missed, not due', () => {
    expect(due('2024-08-30', ['pv-0', 'pv-26'])).toEqual([]);
    expect(due('2024-08-30', ['pv-0', 'pv-12', 'pv-26'])).toEqual([]);
  });
});

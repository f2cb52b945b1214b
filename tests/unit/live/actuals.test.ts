import { describe, expect, it } from 'vitest';
import { foldReports, reportRefusal, type KnownRun, type ReportRecord } from '@/lib/live/actuals';
import { blockAtTime } from '@/lib/live/blocks';

// Reports as an operator makes them during a session (times are real session seconds). The rules
// checked here are the session day's own (README, Session day): common practice for a train
// register — a departure, stops on the way, an arrival; a correction replaces a time, a withdrawal
// takes a report back.
const report = (kind: ReportRecord['kind'], sessionS: number, extra: Partial<ReportRecord> = {}): ReportRecord => ({
  runId: 'r1',
  kind,
  reason: null,
  sessionS,
  correction: false,
  withdrawn: false,
  ...extra,
});
const fold = (...reports: ReportRecord[]) => foldReports(reports).get('r1');

describe('foldReports: what is known of a run from its reports (common practice)', () => {
  it('knows nothing of a run nobody reported', () => {
    expect(foldReports([]).size).toBe(0);
    expect(foldReports([report('departed', 10, { runId: 'r2' })]).get('r1')).toBeUndefined();
  });

  it('a departure, a stop, a departure again and an arrival: one stop from 200 to 260, arrived at 500', () => {
    expect(fold(report('departed', 100), report('stopped', 200, { reason: 'stalled' }), report('departed', 260), report('arrived', 500))).toEqual({
      departS: 100,
      arriveS: 500,
      stops: [{ fromS: 200, toS: 260, reason: 'stalled' }],
    });
  });

  it('keeps each run to itself', () => {
    const known = foldReports([report('departed', 100), report('departed', 150, { runId: 'r2' }), report('stopped', 180, { runId: 'r2' })]);
    expect(known.get('r1')).toEqual({ departS: 100, stops: [] });
    expect(known.get('r2')).toEqual({ departS: 150, stops: [{ fromS: 180, toS: null, reason: null }] });
  });

  it('ignores a second plain departure of a moving train (a double press)', () => {
    expect(fold(report('departed', 100), report('departed', 130))).toEqual({ departS: 100, stops: [] });
  });

  it('a corrected departure replaces the time, also while it is moving', () => {
    expect(fold(report('departed', 100), report('departed', 90, { correction: true }))).toEqual({ departS: 90, stops: [] });
  });

  it('a departure after a stop ends it, never before it began (a typed time earlier than the stop)', () => {
    // The second "departed" is a plain one (the train moves again); its time earlier than the stop
    // is held at the stop's start, so a stop never lasts less than nothing.
    expect(fold(report('departed', 100), report('stopped', 200), report('departed', 150))!.stops).toEqual([{ fromS: 200, toS: 200, reason: null }]);
  });

  it('a withdrawn departure forgets the departure and its stops', () => {
    const run = fold(report('departed', 100), report('stopped', 200), report('departed', 100, { withdrawn: true, correction: true }));
    expect(run).toEqual({ departS: undefined, stops: [] });
  });

  it('an arrival ends an open stop (never before it began); a withdrawn arrival takes the arrival back and leaves the stop', () => {
    expect(fold(report('departed', 100), report('stopped', 200), report('arrived', 300))).toEqual({ departS: 100, arriveS: 300, stops: [{ fromS: 200, toS: 300, reason: null }] });
    expect(fold(report('departed', 100), report('stopped', 200), report('arrived', 150))!.stops).toEqual([{ fromS: 200, toS: 200, reason: null }]);
    const withdrawn = fold(report('departed', 100), report('stopped', 200), report('arrived', 300, { withdrawn: true, correction: true }));
    expect(withdrawn).toEqual({ departS: 100, arriveS: undefined, stops: [{ fromS: 200, toS: null, reason: null }] });
  });

  it('a second stop while standing is ignored; a corrected stop moves the latest one’s start; a withdrawn stop removes the latest', () => {
    expect(fold(report('departed', 100), report('stopped', 200, { reason: 'blocked' }), report('stopped', 220, { reason: 'derailed' }))!.stops).toEqual([
      { fromS: 200, toS: null, reason: 'blocked' },
    ]);
    const two = [report('departed', 100), report('stopped', 200), report('departed', 230), report('stopped', 300, { reason: 'derailed' })];
    expect(fold(...two, report('stopped', 290, { correction: true }))!.stops).toEqual([
      { fromS: 200, toS: 230, reason: null },
      { fromS: 290, toS: null, reason: 'derailed' },
    ]);
    expect(fold(...two, report('stopped', 0, { withdrawn: true, correction: true }))!.stops).toEqual([{ fromS: 200, toS: 230, reason: null }]);
  });

  it('a corrected stop with no stop before it is a stop made at that time', () => {
    expect(fold(report('departed', 100), report('stopped', 150, { correction: true, reason: 'stalled' }))!.stops).toEqual([{ fromS: 150, toS: null, reason: 'stalled' }]);
  });

  it('a stop after a closed one opens a new one', () => {
    expect(fold(report('departed', 100), report('stopped', 200), report('departed', 210), report('stopped', 400))!.stops).toEqual([
      { fromS: 200, toS: 210, reason: null },
      { fromS: 400, toS: null, reason: null },
    ]);
  });
});

describe('reportRefusal: which reports fit the run (common practice)', () => {
  const moving: KnownRun = { departS: 100, stops: [] };
  const standing: KnownRun = { departS: 100, stops: [{ fromS: 200, toS: null, reason: null }] };
  const stoppedOnce: KnownRun = { departS: 100, stops: [{ fromS: 200, toS: 230, reason: null }] };
  const arrived: KnownRun = { departS: 100, arriveS: 400, stops: [] };

  it('a run not yet reported may depart, not arrive or stop', () => {
    expect(reportRefusal(undefined, 'departed', 'now')).toBeNull();
    expect(reportRefusal({ stops: [] }, 'departed', 'now')).toBeNull();
    expect(reportRefusal(undefined, 'arrived', 'now')).toBe('Report the departure first.');
    expect(reportRefusal(undefined, 'stopped', 'now')).toBe('Report the departure first.');
    expect(reportRefusal(undefined, 'arrived', 'typed')).toBe('Report the departure first.');
  });

  it('a moving run may stop or arrive, not depart again', () => {
    expect(reportRefusal(moving, 'departed', 'now')).toBe('This run has already departed.');
    expect(reportRefusal(moving, 'stopped', 'now')).toBeNull();
    expect(reportRefusal(moving, 'arrived', 'now')).toBeNull();
    expect(reportRefusal(stoppedOnce, 'stopped', 'now')).toBeNull();
  });

  it('a standing run may depart again or arrive, not stop again', () => {
    expect(reportRefusal(standing, 'departed', 'now')).toBeNull();
    expect(reportRefusal(standing, 'arrived', 'now')).toBeNull();
    expect(reportRefusal(standing, 'stopped', 'now')).toBe('This train is already reported stopped.');
  });

  it('an arrived run takes no report made now', () => {
    expect(reportRefusal(arrived, 'departed', 'now')).toBe('This run has already arrived.');
    expect(reportRefusal(arrived, 'arrived', 'now')).toBe('This run has already arrived.');
    expect(reportRefusal(arrived, 'stopped', 'now')).toBe('This run has already arrived.');
  });

  it('a typed time corrects the report of its kind when there is one, else is checked like one made now', () => {
    expect(reportRefusal(arrived, 'departed', 'typed')).toBeNull();
    expect(reportRefusal(arrived, 'arrived', 'typed')).toBeNull();
    expect(reportRefusal(stoppedOnce, 'stopped', 'typed')).toBeNull();
    expect(reportRefusal(arrived, 'stopped', 'typed')).toBe('This run has already arrived.');
    expect(reportRefusal(moving, 'arrived', 'typed')).toBeNull();
  });

  it('a withdrawal needs a report of its kind', () => {
    expect(reportRefusal(moving, 'departed', 'withdraw')).toBeNull();
    expect(reportRefusal(arrived, 'arrived', 'withdraw')).toBeNull();
    expect(reportRefusal(stoppedOnce, 'stopped', 'withdraw')).toBeNull();
    expect(reportRefusal(moving, 'arrived', 'withdraw')).toBe('There is no “arrived” report to withdraw.');
    expect(reportRefusal(moving, 'stopped', 'withdraw')).toBe('There is no “stopped” report to withdraw.');
    expect(reportRefusal(undefined, 'departed', 'withdraw')).toBe('There is no “departed” report to withdraw.');
    expect(reportRefusal({ stops: [] }, 'departed', 'withdraw')).toBe('There is no “departed” report to withdraw.');
  });
});

describe('blockAtTime: the block a train is expected in (common practice: a block is occupied from entry until exit)', () => {
  const steps = [
    { blockId: 'A', enterS: 0, exitS: 100 },
    { blockId: 'B', enterS: 90, exitS: 200 },
  ];
  it('is the block entered last: on entry it counts, on exit it no longer does', () => {
    expect(blockAtTime(steps, 0)).toBe('A');
    expect(blockAtTime(steps, 89)).toBe('A');
    // Both blocks are occupied while the train crosses from A to B: the one entered last.
    expect(blockAtTime(steps, 90)).toBe('B');
    expect(blockAtTime(steps, 100)).toBe('B');
    expect(blockAtTime(steps, 199)).toBe('B');
  });
  it('is null before the first entry and from the last exit on', () => {
    expect(blockAtTime(steps, -1)).toBeNull();
    expect(blockAtTime(steps, 200)).toBeNull();
    expect(blockAtTime([], 10)).toBeNull();
  });
});

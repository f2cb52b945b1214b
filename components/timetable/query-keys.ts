/** Every TanStack Query key the timetable builder uses, in one place. */
export const timetableKeys = {
  all: ['timetable'] as const,
  session: (sessionId: string) => ['timetable', sessionId] as const,
  /** The stored runs with findings: TimetableSnapshot. */
  builder: (sessionId: string) => ['timetable', sessionId, 'builder'] as const,
  /** The load profile (GET …/check?only=load), fetched when the Load view is opened. */
  load: (sessionId: string) => ['timetable', sessionId, 'load'] as const,
  /** suggestRetime's proposal for the current runs. */
  retime: (sessionId: string) => ['timetable', sessionId, 'retime'] as const,
  /** The control schedule's findings after the builder's `revision`-th change. */
  control: (sessionId: string, revision: number) => ['timetable', sessionId, 'control', revision] as const,
};

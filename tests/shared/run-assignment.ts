import type { RunAssignment } from '@/lib/invitations/assignments';

/**
 * One run as an invitee's e-mail lists it (lib/invitations/assignments.ts), for the unit tests of the
 * message and of what changed. Times: Europe/Berlin is UTC+1 in December (CET, IANA tz database,
 * europe file), so 17:10Z is 18:10 on the wall clock.
 */
export const sampleRun: RunAssignment = {
  runId: 'r1',
  operatorId: 'u-ann',
  operatorName: 'Ann',
  trainName: 'Goods',
  cabName: 'Cab 1',
  route: ['Yard', 'Main', 'Halt'],
  departS: 600,
  arriveS: 720,
  departAt: new Date('2026-12-12T17:10:00Z'),
  arriveAt: new Date('2026-12-12T17:12:00Z'),
  realDepart: '18:10',
  realArrive: '18:12',
  fastDepart: '06:40',
  fastArrive: '06:48',
  standBeforeS: 60,
  standAfterS: 90,
  before: { operatorId: 'u-bob', operatorName: 'Bob', trainName: 'Local', fastDepart: '06:10' } as RunAssignment['before'],
  after: { operatorId: 'u-ann', operatorName: 'Ann', trainName: 'Express', fastDepart: '07:20' } as RunAssignment['after'],
  note: '',
};

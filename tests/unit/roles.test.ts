// lib/roles.ts: the order of the three roles and the words the members screen shows for them.
// Loaded again before each test (vi.resetModules, then import): the label tables are built when the
// module is evaluated, and a module imported at the top of this file would be built before a mutation
// test run switches a change on.
import { beforeEach, describe, expect, it, vi } from 'vitest';

let R: typeof import('@/lib/roles');

beforeEach(async () => {
  vi.resetModules();
  R = await import('@/lib/roles');
});

describe('roles', () => {
  it('orders host > planner > operator (common practice: each role may do what the roles below it may)', () => {
    const table = R.ROLES.flatMap((role) => R.ROLES.map((minimum) => `${role}≥${minimum}:${R.roleAtLeast(role, minimum)}`));
    expect(table.sort()).toStrictEqual(
      [
        'host≥host:true',
        'host≥planner:true',
        'host≥operator:true',
        'planner≥host:false',
        'planner≥planner:true',
        'planner≥operator:true',
        'operator≥host:false',
        'operator≥planner:false',
        'operator≥operator:true',
      ].sort(),
    );
  });

  it('names and sums up every role in the words the screens use', () => {
    expect(R.ROLE_LABELS).toStrictEqual({ host: 'Host', planner: 'Planner', operator: 'Operator' });
    expect(R.ROLE_SUMMARIES).toStrictEqual({
      host: 'Everything, including members, roles and sending invitations.',
      planner: 'Layouts, power, rolling stock and timetables.',
      operator: 'Their own runs, published timetables of sessions they are invited to, and replies.',
    });
  });
});

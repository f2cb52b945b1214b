import { fastFormatter } from './clock';
import { firstById } from './plan-index';
import type { Plan } from './schema';

/** How findings name the things of a plan: by the names people gave them, never by ids. */
export interface PlanNames {
  /** A run as its train and fast-clock departure, e.g. `Pick-up goods (06:56 departure)`. */
  run(runId: string): string;
  block(blockId: string): string;
  cab(cabId: string): string;
  operator(operatorId: string): string;
  train(trainId: string): string;
  driver(driverId: string): string;
  supply(supplyId: string): string;
  locomotive(locomotiveId: string): string;
  /** A real session time on the fast clock's face, `HH:MM`. */
  fast(realS: number): string;
  /** `from HH:MM to HH:MM fast` (one time when both fall in the same fast minute). */
  span(fromS: number, toS: number): string;
}

const namesOf = (list: readonly { id: string; name: string }[]) => firstById(list, (item) => item.name.trim());

/**
 * Name lookups for a plan's findings. A thing with an empty name (or an id the plan does not
 * hold) falls back to its id in quotes, so a message always says which one is meant.
 */
export function planNames(plan: Plan): PlanNames {
  const blocks = namesOf(plan.blocks);
  const cabs = namesOf(plan.cabs);
  const operators = namesOf(plan.operators);
  const trains = namesOf(plan.trains);
  const drivers = namesOf(plan.drivers);
  const supplies = namesOf(plan.supplies);
  const locomotives = namesOf(plan.locomotives);
  const runs: Map<string, { trainId: string; departS: number }> = firstById(plan.runs, (run) => run);
  const lookup = (map: Map<string, string>) => (id: string) => {
    const name = map.get(id);
    return name ? name : `"${id}"`;
  };
  const fast = fastFormatter(plan.clock);
  const train = lookup(trains);
  return {
    run: (runId) => {
      const run = runs.get(runId);
      return run ? `${train(run.trainId)} (${fast(run.departS)} departure)` : `run "${runId}"`;
    },
    block: lookup(blocks),
    cab: lookup(cabs),
    operator: lookup(operators),
    train,
    driver: lookup(drivers),
    supply: lookup(supplies),
    locomotive: lookup(locomotives),
    fast,
    span: (fromS, toS) => {
      const from = fast(fromS);
      const to = fast(toS);
      return from === to ? `at ${from} fast` : `from ${from} to ${to} fast`;
    },
  };
}

/**
 * `Cab 3` stays `Cab 3`, but a cab named `North` becomes `cab North`: the noun is added only when
 * the name does not already say what it is.
 */
export function withNoun(noun: string, name: string): string {
  return name.toLowerCase().includes(noun.toLowerCase()) ? name : `${noun} ${name}`;
}

/**
 * A finding's message in sentence case: its first letter upper-case (`cab North is…` reads
 * `Cab North is…`), the rest as written, so names keep their own spelling.
 */
export function sentenceCase(text: string): string {
  const first = text.codePointAt(0);
  if (first === undefined) return text;
  const head = String.fromCodePoint(first);
  return head.toUpperCase() + text.slice(head.length);
}

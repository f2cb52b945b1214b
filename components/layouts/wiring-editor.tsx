'use client';

import { useActionState, useId, useMemo, useState, type ReactNode } from 'react';
import { Button } from '@/components/ui/button';
import { inputClass } from '@/components/ui/field';
import { BOARD_KINDS, BOARDS, findPin, type BoardKind, type BoardPin } from '@/lib/control/boards';
import { DEFAULT_TIMING, wiringSheetSchema, type BlockWiring, type BoardWiring, type CabWiring, type ControlTiming, type WiringSheet } from '@/lib/control/wiring';
import type { ActionState } from '@/lib/errors';

type Named = { id: string; name: string };
type Errors = Map<string, string>;

const MAX_BOARDS = 8;
const selectClass = `${inputClass} py-1.5`;

/** The sheet's pins by their canonical names ("PD6", "GPIO18"), however they were typed. */
function normalise(sheet: WiringSheet): WiringSheet {
  const kindOf = new Map(sheet.boards.map((b) => [b.id, b.kind]));
  const pin = (boardId: string, name: string) => {
    const kind = kindOf.get(boardId);
    return kind ? (findPin(kind, name)?.name ?? name) : name;
  };
  return {
    ...sheet,
    boards: sheet.boards.map((b) => ({ ...b, emergencyStopPin: pin(b.id, b.emergencyStopPin), startPin: b.startPin === null ? null : pin(b.id, b.startPin) })),
    cabs: sheet.cabs.map((c) => ({ ...c, forwardPin: pin(c.boardId, c.forwardPin), reversePin: pin(c.boardId, c.reversePin), pwmPin: pin(c.boardId, c.pwmPin) })),
    blocks: sheet.blocks.map((b) => ({
      ...b,
      feeds: b.feeds.map((f) => ({ ...f, pin: pin(b.boardId, f.pin) })),
      polarityPin: b.polarityPin === null ? null : pin(b.boardId, b.polarityPin),
    })),
  };
}

const freePins = (kind: BoardKind) => BOARDS[kind].pins.filter((p) => !p.serial);

function newBoard(existing: BoardWiring[]): BoardWiring {
  let n = existing.length + 1;
  while (existing.some((b) => b.id === `board-${n}`)) n += 1;
  const taken = new Set(existing.filter((b) => b.kind === 'atmega328p').map((b) => b.emergencyStopPin));
  const stop = freePins('atmega328p').find((p) => !p.pwm && !taken.has(p.name))!;
  return { id: `board-${n}`, kind: 'atmega328p', name: `Board ${n}`, emergencyStopPin: stop.name, startPin: null };
}

/** Who uses each pin of each board ("board\0PD6" → "the forward input of Cab 1"). */
function pinUse(sheet: WiringSheet, cabName: (id: string) => string, blockName: (id: string) => string): Map<string, string> {
  const used = new Map<string, string>();
  const put = (boardId: string, pin: string | null, what: string) => {
    if (pin && !used.has(`${boardId}\0${pin}`)) used.set(`${boardId}\0${pin}`, what);
  };
  for (const b of sheet.boards) {
    put(b.id, b.emergencyStopPin, 'the emergency stop');
    put(b.id, b.startPin, 'the start button');
  }
  for (const c of sheet.cabs) {
    put(c.boardId, c.forwardPin, `forward of ${cabName(c.cabId)}`);
    put(c.boardId, c.reversePin, `reverse of ${cabName(c.cabId)}`);
    put(c.boardId, c.pwmPin, `PWM of ${cabName(c.cabId)}`);
  }
  for (const b of sheet.blocks) {
    for (const f of b.feeds) put(b.boardId, f.pin, `relay ${blockName(b.blockId)} → ${cabName(f.cabId)}`);
    put(b.boardId, b.polarityPin, `polarity of ${blockName(b.blockId)}`);
  }
  return used;
}

/** The sheet's own checks (the same schema the server runs), keyed by path, with ids shown as names. */
function checkSheet(sheet: WiringSheet, names: Map<string, string>): Errors {
  const result = wiringSheetSchema.safeParse(sheet);
  const errors: Errors = new Map();
  if (result.success) return errors;
  for (const issue of result.error.issues) {
    const key = issue.path.join('.');
    const message = issue.message.replace(/"([^"]+)"/g, (whole, id: string) => (names.has(id) ? `“${names.get(id)}”` : whole));
    if (!errors.has(key)) errors.set(key, message);
  }
  return errors;
}

/**
 * The wiring sheet as a form: boards with their emergency-stop and start inputs; per cab its board,
 * the two direction inputs and the PWM output; per block one relay per cab and the polarity relay;
 * the timing. Pins come from each board's pinout (PWM outputs only from its PWM-capable pins, the
 * serial pins never offered, a pin in use marked); the sheet's checks run as it is edited and again
 * on the server when it is saved.
 */
export function WiringEditor({
  save,
  initial,
  version,
  cabs,
  blocks,
}: {
  save: (prev: ActionState, form: FormData) => Promise<ActionState>;
  initial: WiringSheet | null;
  version: number | null;
  cabs: Named[];
  blocks: Named[];
}) {
  const [state, action, pending] = useActionState(save, null);
  const [sheet, setSheet] = useState<WiringSheet>(() =>
    initial ? normalise(initial) : { version: 1, boards: [newBoard([])], cabs: [], blocks: [], timing: DEFAULT_TIMING },
  );
  const names = useMemo(() => new Map([...cabs, ...blocks, ...sheet.boards].map((x) => [x.id, x.name])), [cabs, blocks, sheet.boards]);
  const cabName = (id: string) => names.get(id) ?? id;
  const blockName = (id: string) => names.get(id) ?? id;
  const errors = useMemo(() => checkSheet(sheet, names), [sheet, names]);
  const used = pinUse(sheet, cabName, blockName);
  const boardOf = new Map(sheet.boards.map((b) => [b.id, b]));
  const firstBoard = sheet.boards[0]!;

  const setBoard = (i: number, change: Partial<BoardWiring>) =>
    setSheet((s) => ({ ...s, boards: s.boards.map((b, j) => (j === i ? { ...b, ...change } : b)) }));
  const setCab = (cabId: string, change: Partial<CabWiring> | null) =>
    setSheet((s) => {
      const at = s.cabs.findIndex((c) => c.cabId === cabId);
      if (change === null) {
        return { ...s, cabs: s.cabs.filter((c) => c.cabId !== cabId), blocks: s.blocks.map((b) => ({ ...b, feeds: b.feeds.filter((f) => f.cabId !== cabId) })) };
      }
      if (at < 0) return { ...s, cabs: [...s.cabs, { cabId, boardId: firstBoard.id, forwardPin: '', reversePin: '', pwmPin: '', bothHighBrakes: false, ...change }] };
      return { ...s, cabs: s.cabs.map((c, j) => (j === at ? { ...c, ...change } : c)) };
    });
  const setBlock = (blockId: string, change: Partial<BlockWiring> | null) =>
    setSheet((s) => {
      const at = s.blocks.findIndex((b) => b.blockId === blockId);
      if (change === null) {
        return { ...s, blocks: s.blocks.filter((b) => b.blockId !== blockId).map((b) => ({ ...b, forwardTowards: b.forwardTowards.filter((t) => t !== blockId) })) };
      }
      if (at < 0) return { ...s, blocks: [...s.blocks, { blockId, boardId: firstBoard.id, feeds: [], polarityPin: null, forwardTowards: [], ...change }] };
      return { ...s, blocks: s.blocks.map((b, j) => (j === at ? { ...b, ...change } : b)) };
    });
  const setTiming = (key: keyof ControlTiming, value: string) => setSheet((s) => ({ ...s, timing: { ...s.timing, [key]: value === '' ? Number.NaN : Number(value) } }));

  const pinSelect = (props: { label: string; boardId: string; value: string | null; path: string; pwm?: boolean; none?: string; onChange: (pin: string | null) => void }) => {
    const board = boardOf.get(props.boardId);
    return (
      <PinSelect
        {...props}
        kind={board?.kind ?? null}
        inUse={(pin) => {
          const holder = used.get(`${props.boardId}\0${pin.name}`);
          return holder && pin.name !== props.value ? holder : null;
        }}
        error={errors.get(props.path)}
      />
    );
  };

  const serverErrors = state && !state.ok ? Object.entries(state.fieldErrors ?? {}) : [];
  return (
    <form action={action} className="space-y-6 no-print" data-testid="wiring-form" noValidate>
      <input type="hidden" name="version" value={version ?? ''} />
      <input type="hidden" name="sheet" value={JSON.stringify(sheet)} />

      <fieldset className="space-y-3">
        <legend className="font-display text-lg font-bold">Boards</legend>
        {sheet.boards.map((board, i) => (
          <div key={board.id} className="grid gap-3 rounded-plate border border-line p-3 sm:grid-cols-2 lg:grid-cols-5" data-testid="wiring-board">
            <Labelled label="Name" error={errors.get(`boards.${i}.name`)}>
              {(id) => <input id={id} value={board.name} maxLength={60} onChange={(e) => setBoard(i, { name: e.target.value })} className={selectClass} />}
            </Labelled>
            <Labelled label="Kind" error={errors.get(`boards.${i}.kind`)}>
              {(id) => (
                <select id={id} value={board.kind} onChange={(e) => setBoard(i, { kind: e.target.value as BoardKind })} className={selectClass}>
                  {BOARD_KINDS.map((k) => <option key={k} value={k}>{BOARDS[k].title}</option>)}
                </select>
              )}
            </Labelled>
            {pinSelect({ label: 'Emergency stop input', boardId: board.id, value: board.emergencyStopPin, path: `boards.${i}.emergencyStopPin`, onChange: (pin) => setBoard(i, { emergencyStopPin: pin ?? '' }) })}
            {pinSelect({ label: 'Start button', boardId: board.id, value: board.startPin, path: `boards.${i}.startPin`, none: 'None: a "start" line on the serial port', onChange: (pin) => setBoard(i, { startPin: pin }) })}
            <div className="flex items-end">
              <Button
                type="button"
                variant="danger"
                className="px-3 py-1.5"
                disabled={sheet.boards.length === 1}
                onClick={() => setSheet((s) => ({ ...s, boards: s.boards.filter((_, j) => j !== i) }))}
              >
                Remove board
              </Button>
            </div>
          </div>
        ))}
        <Button type="button" variant="secondary" disabled={sheet.boards.length >= MAX_BOARDS} onClick={() => setSheet((s) => ({ ...s, boards: [...s.boards, newBoard(s.boards)] }))}>
          Add a board
        </Button>
      </fieldset>

      <fieldset className="space-y-3">
        <legend className="font-display text-lg font-bold">Cabs</legend>
        <p className="text-sm text-muted">Each cab drives one H-bridge channel: one input high drives forward, the other reverse; the PWM output sets the speed.</p>
        {cabs.map((cab) => {
          const i = sheet.cabs.findIndex((c) => c.cabId === cab.id);
          const wired = sheet.cabs[i];
          return (
            <div key={cab.id} className="space-y-2 rounded-plate border border-line p-3" data-testid="wiring-cab" data-cab={cab.name}>
              <label className="flex items-center gap-2 font-semibold">
                <input type="checkbox" checked={Boolean(wired)} onChange={(e) => setCab(cab.id, e.target.checked ? {} : null)} />
                {cab.name}
              </label>
              {wired ? (
                <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
                  <BoardSelect boards={sheet.boards} value={wired.boardId} error={errors.get(`cabs.${i}.boardId`)} onChange={(boardId) => setCab(cab.id, { boardId })} />
                  {pinSelect({ label: 'Forward input', boardId: wired.boardId, value: wired.forwardPin, path: `cabs.${i}.forwardPin`, onChange: (pin) => setCab(cab.id, { forwardPin: pin ?? '' }) })}
                  {pinSelect({ label: 'Reverse input', boardId: wired.boardId, value: wired.reversePin, path: `cabs.${i}.reversePin`, onChange: (pin) => setCab(cab.id, { reversePin: pin ?? '' }) })}
                  {pinSelect({ label: 'PWM output', boardId: wired.boardId, value: wired.pwmPin, path: `cabs.${i}.pwmPin`, pwm: true, onChange: (pin) => setCab(cab.id, { pwmPin: pin ?? '' }) })}
                  <label className="flex items-start gap-2 text-sm sm:col-span-2 lg:col-span-4">
                    <input type="checkbox" className="mt-1" checked={wired.bothHighBrakes} onChange={(e) => setCab(cab.id, { bothHighBrakes: e.target.checked })} />
                    <span>
                      The driver is an integrated bridge whose truth table brakes with both inputs high (recorded on the sheet; Fishplate never sets both high —
                      on a bridge of discrete transistors that shorts the supply).
                    </span>
                  </label>
                </div>
              ) : null}
            </div>
          );
        })}
      </fieldset>

      <fieldset className="space-y-3">
        <legend className="font-display text-lg font-bold">Blocks</legend>
        <p className="text-sm text-muted">One relay output per cab that may feed the block; a polarity relay for a reversing section.</p>
        {blocks.map((block) => {
          const i = sheet.blocks.findIndex((b) => b.blockId === block.id);
          const wired = sheet.blocks[i];
          return (
            <div key={block.id} className="space-y-2 rounded-plate border border-line p-3" data-testid="wiring-block" data-block={block.name}>
              <label className="flex items-center gap-2 font-semibold">
                <input type="checkbox" checked={Boolean(wired)} onChange={(e) => setBlock(block.id, e.target.checked ? {} : null)} />
                {block.name}
              </label>
              {wired ? (
                <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
                  <BoardSelect boards={sheet.boards} value={wired.boardId} error={errors.get(`blocks.${i}.boardId`)} onChange={(boardId) => setBlock(block.id, { boardId })} />
                  {sheet.cabs.map((cab) => {
                    const j = wired.feeds.findIndex((f) => f.cabId === cab.cabId);
                    return (
                      <div key={cab.cabId}>
                        {pinSelect({
                          label: `Relay to ${cabName(cab.cabId)}`,
                          boardId: wired.boardId,
                          value: wired.feeds[j]?.pin ?? null,
                          path: `blocks.${i}.feeds.${j}.pin`,
                          none: 'No relay',
                          onChange: (pin) =>
                            setBlock(block.id, {
                              feeds:
                                pin === null
                                  ? wired.feeds.filter((f) => f.cabId !== cab.cabId)
                                  : j < 0
                                    ? [...wired.feeds, { cabId: cab.cabId, pin }]
                                    : wired.feeds.map((f) => (f.cabId === cab.cabId ? { ...f, pin } : f)),
                            }),
                        })}
                      </div>
                    );
                  })}
                  {pinSelect({ label: 'Polarity relay', boardId: wired.boardId, value: wired.polarityPin, path: `blocks.${i}.polarityPin`, none: 'None (not a reversing section)', onChange: (pin) => setBlock(block.id, { polarityPin: pin }) })}
                </div>
              ) : null}
            </div>
          );
        })}
      </fieldset>

      <fieldset className="grid gap-3 sm:grid-cols-3">
        <legend className="mb-2 font-display text-lg font-bold">Timing</legend>
        {(
          [
            ['leadS', 'Connect a block before the head enters (s)', '0.1'],
            ['releaseS', 'Release after the tail clears (s)', '0.1'],
            ['deadTimeMs', 'PWM at 0 before a direction change (ms)', '1'],
            ['breakMs', 'Between one relay opening and another closing (ms)', '1'],
          ] as const
        ).map(([key, label, step]) => (
          <Labelled key={key} label={label} error={errors.get(`timing.${key}`)}>
            {(id) => (
              <input
                id={id}
                type="number"
                step={step}
                value={Number.isNaN(sheet.timing[key]) ? '' : sheet.timing[key]}
                onChange={(e) => setTiming(key, e.target.value)}
                className={selectClass}
              />
            )}
          </Labelled>
        ))}
        <p className="text-sm text-muted sm:col-span-3">
          Each cab&apos;s direction comes from the layout: the train&apos;s direction of travel through each block&apos;s ends and the block&apos;s wiring (which rail gets the +), so that the right-hand rail is positive (NEM 631 2.3). Speed ramps follow each train&apos;s acceleration and braking.
        </p>
      </fieldset>

      <div className="space-y-2">
        {errors.size ? (
          <p className="text-sm text-signal" data-testid="wiring-problems">
            {errors.size} problem{errors.size === 1 ? '' : 's'} to fix before saving (marked above).
          </p>
        ) : null}
        {state && !state.ok ? (
          <div role="alert" className="text-sm text-signal">
            <p>{state.error}</p>
            {serverErrors.length ? <ul className="list-inside list-disc">{serverErrors.map(([k, v]) => <li key={k}>{String(v)}</li>)}</ul> : null}
          </div>
        ) : null}
        {state?.ok ? <p className="text-sm text-verdigris" role="status">Wiring sheet saved.</p> : null}
        <Button type="submit" disabled={pending || errors.size > 0}>{pending ? 'Saving…' : 'Save wiring sheet'}</Button>
      </div>
    </form>
  );
}

function Labelled({ label, error, children }: { label: string; error?: string; children: (id: string) => ReactNode }) {
  const id = useId();
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block text-sm font-semibold">{label}</label>
      {children(id)}
      {error ? <p className="text-sm text-signal" data-testid="wiring-error">{error}</p> : null}
    </div>
  );
}

function BoardSelect({ boards, value, error, onChange }: { boards: BoardWiring[]; value: string; error?: string; onChange: (boardId: string) => void }) {
  return (
    <Labelled label="Board" error={error}>
      {(id) => (
        <select id={id} value={value} onChange={(e) => onChange(e.target.value)} className={selectClass}>
          {boards.some((b) => b.id === value) ? null : <option value={value}>Choose a board</option>}
          {boards.map((b) => <option key={b.id} value={b.id}>{b.name}</option>)}
        </select>
      )}
    </Labelled>
  );
}

/**
 * A pin of the board, named by port and bit and by its header label. Only the board's pins are
 * offered (no serial pin; for PWM only PWM-capable ones); a pin in use elsewhere says by what.
 */
function PinSelect({
  label,
  kind,
  value,
  pwm = false,
  none,
  inUse,
  error,
  onChange,
}: {
  label: string;
  kind: BoardKind | null;
  value: string | null;
  pwm?: boolean;
  none?: string;
  inUse: (pin: BoardPin) => string | null;
  error?: string;
  onChange: (pin: string | null) => void;
}) {
  const pins = kind ? freePins(kind).filter((p) => !pwm || BOARDS[kind].pwmCapable(p)) : [];
  const known = value === null || value === '' || pins.some((p) => p.name === value);
  return (
    <Labelled label={label} error={error}>
      {(id) => (
        <select id={id} value={value ?? ''} onChange={(e) => onChange(e.target.value === '' ? null : e.target.value)} className={selectClass} aria-invalid={error ? true : undefined}>
          <option value="">{none ?? 'Choose a pin'}</option>
          {known ? null : <option value={value!}>{value} (not on this board)</option>}
          {pins.map((p) => {
            const holder = inUse(p);
            const hw = kind === 'header40' && p.hardwarePwm ? ', hardware PWM' : '';
            return (
              <option key={p.name} value={p.name} disabled={holder !== null}>
                {p.name} ({p.label}{hw}){holder ? ` — ${holder}` : ''}
              </option>
            );
          })}
        </select>
      )}
    </Labelled>
  );
}

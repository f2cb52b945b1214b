import type { Metadata } from 'next';
import { loadLayoutRows } from '@/db/queries/plan-data';
import { PrintButton } from '@/components/crew/print-button';
import { SafetyCautions } from '@/components/layouts/safety-cautions';
import { WiringEditor } from '@/components/layouts/wiring-editor';
import { Card } from '@/components/ui/card';
import { BOARDS, pinTitle } from '@/lib/control';
import { layoutForPage } from '@/lib/layouts/layout-page';
import { layoutWiringSheet } from '@/lib/sessions/control';
import { saveWiring } from '../actions';

export const metadata: Metadata = { title: 'Wiring sheet' };

export default async function WiringPage({ params }: { params: Promise<{ railwayId: string; layoutId: string }> }) {
  const { railwayId, layoutId } = await params;
  const { layout, canEdit } = await layoutForPage(railwayId, layoutId, '/wiring');
  const rows = loadLayoutRows(layout.id);
  let stored: ReturnType<typeof layoutWiringSheet> = null;
  let problem: string | null = null;
  try {
    stored = layoutWiringSheet(layout.id);
  } catch (error) {
    problem = error instanceof Error ? error.message : 'The stored sheet cannot be read.';
  }
  const cabName = new Map(rows.cabs.map((c) => [c.id, c.name]));
  const blockName = new Map(rows.blocks.map((b) => [b.id, b.name]));
  const sheet = stored?.sheet;
  const boardOf = new Map(sheet?.boards.map((b) => [b.id, b]) ?? []);
  const pin = (boardId: string, name: string) => {
    const board = boardOf.get(boardId);
    return board ? pinTitle(board.kind, name) : name;
  };
  return (
    <div className="space-y-6" data-testid="wiring-page">
      {problem ? <p className="text-signal">{problem}</p> : null}
      {sheet ? (
        <Card title="Wiring sheet" action={<PrintButton label="Print wiring sheet" />}>
          <div className="space-y-4 text-sm" data-testid="wiring-sheet">
            <p className="text-muted">Pins by port and bit, with the label printed beside the header in brackets. Sources: each board&apos;s published pinout.</p>
            <table className="w-full text-left">
              <thead><tr><th>Board</th><th>Kind</th><th>Emergency stop (normally closed to ground)</th><th>Start button</th></tr></thead>
              <tbody>
                {sheet.boards.map((b) => (
                  <tr key={b.id} className="border-t border-line">
                    <td>{b.name}</td><td>{BOARDS[b.kind].title}</td><td>{pin(b.id, b.emergencyStopPin)}</td><td>{b.startPin ? pin(b.id, b.startPin) : 'serial "start" only'}</td>
                  </tr>
                ))}
              </tbody>
            </table>
            <table className="w-full text-left">
              <thead><tr><th>Cab</th><th>Board</th><th>Forward input</th><th>Reverse input</th><th>PWM</th></tr></thead>
              <tbody>
                {sheet.cabs.map((c) => (
                  <tr key={c.cabId} className="border-t border-line">
                    <td>{cabName.get(c.cabId) ?? c.cabId}</td><td>{boardOf.get(c.boardId)?.name}</td>
                    <td>{pin(c.boardId, c.forwardPin)}</td><td>{pin(c.boardId, c.reversePin)}</td><td>{pin(c.boardId, c.pwmPin)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
            <table className="w-full text-left">
              <thead><tr><th>Block</th><th>Board</th><th>Relay per cab</th><th>Polarity relay</th></tr></thead>
              <tbody>
                {sheet.blocks.map((b) => (
                  <tr key={b.blockId} className="border-t border-line">
                    <td>{blockName.get(b.blockId) ?? b.blockId}</td><td>{boardOf.get(b.boardId)?.name}</td>
                    <td>{b.feeds.map((f) => `${cabName.get(f.cabId) ?? f.cabId}: ${pin(b.boardId, f.pin)}`).join('; ')}</td>
                    <td>{b.polarityPin ? pin(b.boardId, b.polarityPin) : '—'}</td>
                  </tr>
                ))}
              </tbody>
            </table>
            <p className="text-muted">
              Timing: blocks connect {sheet.timing.leadS} s before the head enters and release {sheet.timing.releaseS} s after the tail clears; PWM at 0 for{' '}
              {sheet.timing.deadTimeMs} ms before a direction change; {sheet.timing.breakMs} ms between one relay opening and another closing. Speed ramps follow each train&apos;s acceleration and braking.
            </p>
            <p>Relays driven from a board pin need a driver transistor and a flyback diode (or a relay module that has them); a board pin sources only a few tens of mA (40 mA absolute maximum per pin, ATmega328P datasheet).</p>
          </div>
        </Card>
      ) : (
        <Card title="Wiring sheet"><p className="text-muted" data-testid="no-wiring">This layout has no wiring sheet yet.</p></Card>
      )}
      <SafetyCautions />
      {canEdit ? (
        <Card title="Edit the wiring sheet" className="no-print">
          {problem ? <p className="mb-2 text-sm text-signal">The stored sheet no longer passes its checks, so the form starts afresh.</p> : null}
          <WiringEditor
            save={saveWiring.bind(null, railwayId, layout.id)}
            initial={sheet ?? null}
            version={stored?.version ?? null}
            cabs={rows.cabs.map((c) => ({ id: c.id, name: c.name }))}
            blocks={rows.blocks.map((b) => ({ id: b.id, name: b.name }))}
          />
        </Card>
      ) : null}
    </div>
  );
}

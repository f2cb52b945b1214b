import type { DutyTable } from '@/lib/layouts/power-budget';

/**
 * PWM duty per train, scale speed and cab, from the engine's calibrated model (dutyFor): no motion
 * below the start voltage, then speed in proportion to the voltage above it, reaching top speed at
 * the rated voltage.
 */
export function DutyTablesView({ tables }: { tables: DutyTable[] }) {
  if (tables.length === 0) return <p className="text-sm text-muted">Add trains to see the duty they need.</p>;
  return (
    <div className="space-y-3" data-testid="duty-tables">
      <p className="text-sm text-muted">
        Calibrated model: a locomotive stands below its start voltage, then its speed grows in proportion to the average track voltage above it, reaching its
        top speed at its rated voltage (no start voltage entered: from 0 V). PWM gives duty × (supply − bridge drop) on average (NEM 630 Table 2 judges
        pulsed supplies by their average); the drop is the bridge&apos;s greatest at the train&apos;s running current, and each cab&apos;s heading shows what
        the rails then get. Motors slow under load: treat each figure as a first setting to trim by eye. 8-bit value = duty × 255.
      </p>
      {tables.map((t) => (
        <details key={t.trainId} className="rounded-plate border border-line p-3" data-testid="duty-table">
          <summary className="cursor-pointer font-semibold">
            {t.trainName} <span className="font-normal text-muted">· top speed {t.topSpeedKmh ?? '—'} km/h</span>
          </summary>
          {t.cabs.length === 0 ? (
            <p className="mt-2 text-sm text-muted">No cabs yet.</p>
          ) : (
            <div className="mt-2 overflow-x-auto">
              <table className="w-full text-left text-sm">
                <thead className="text-xs uppercase text-muted">
                  <tr>
                    <th className="px-2 py-1">Scale speed</th>
                    {t.cabs.map((c) => (
                      <th key={c.id} className="px-2 py-1">
                        {c.name} <span className="normal-case">({Math.round(c.trackVolts * 100) / 100} V)</span>
                      </th>
                    ))}
                  </tr>
                </thead>
                <tbody className="divide-y divide-line">
                  {t.speeds.map((speed, i) => (
                    <tr key={speed}>
                      <td className="px-2 py-1 font-semibold">{speed} km/h</td>
                      {t.rows[i]!.map((cell, j) => (
                        <td key={j} className="px-2 py-1">
                          {cell.ok ? (
                            <>
                              {Math.round((cell.duty ?? 0) * 1000) / 10} % <span className="text-muted">({cell.pwm8}/255)</span>
                              {cell.note ? <span className="block text-xs text-muted">{cell.note}</span> : null}
                            </>
                          ) : (
                            <span className="text-xs text-signal">{cell.note}</span>
                          )}
                        </td>
                      ))}
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
        </details>
      ))}
    </div>
  );
}

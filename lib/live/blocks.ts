/** The block a train is expected in at `atS` (the one it entered last), or null. Client-safe. */
export function blockAtTime(steps: readonly { blockId: string; enterS: number; exitS: number }[], atS: number): string | null {
  let found: string | null = null;
  for (const step of steps) if (step.enterS <= atS && atS < step.exitS) found = step.blockId;
  return found;
}

'use client';

import * as AlertDialog from '@radix-ui/react-alert-dialog';
import type { ReactNode } from 'react';
import { buttonClass } from './button';

/**
 * A button that asks before it acts (Radix alert dialog: focus trapped inside, Escape or "keep" closes it,
 * the focus goes back to the button). The confirming button submits the form named by `form`.
 */
export function ConfirmDialog({
  trigger,
  triggerVariant = 'secondary',
  title,
  children,
  confirm,
  keep,
  form,
  danger = false,
  disabled = false,
}: {
  trigger: string;
  triggerVariant?: 'primary' | 'secondary' | 'danger';
  title: string;
  children: ReactNode;
  confirm: string;
  keep: string;
  form: string;
  danger?: boolean;
  disabled?: boolean;
}) {
  return (
    <AlertDialog.Root>
      <AlertDialog.Trigger className={buttonClass(triggerVariant)} disabled={disabled}>
        {trigger}
      </AlertDialog.Trigger>
      <AlertDialog.Portal>
        <AlertDialog.Overlay className="fixed inset-0 z-50 bg-ink/40" />
        <AlertDialog.Content className="fixed left-1/2 top-1/2 z-50 w-[min(32rem,calc(100vw-1rem))] -translate-x-1/2 -translate-y-1/2 rounded-plate border border-line bg-surface p-5 shadow-lg">
          <AlertDialog.Title className="mb-2 font-display text-lg font-bold">{title}</AlertDialog.Title>
          <AlertDialog.Description asChild>
            <div className="space-y-2 text-sm">{children}</div>
          </AlertDialog.Description>
          <div className="mt-4 flex flex-wrap justify-end gap-2">
            <AlertDialog.Cancel className={buttonClass('secondary')}>{keep}</AlertDialog.Cancel>
            {/* The dialog unmounts as it closes, before a native submit would happen: submit the form directly. */}
            <AlertDialog.Action
              type="button"
              onClick={() => (document.getElementById(form) as HTMLFormElement | null)?.requestSubmit()}
              className={buttonClass(danger ? 'danger' : 'primary')}
            >
              {confirm}
            </AlertDialog.Action>
          </div>
        </AlertDialog.Content>
      </AlertDialog.Portal>
    </AlertDialog.Root>
  );
}

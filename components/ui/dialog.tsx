'use client';

import { useEffect, useRef, type ReactNode } from 'react';

/** A modal dialog on the native <dialog> element: focus is trapped by the browser, Escape closes. */
export function Dialog({ open, onClose, title, children }: { open: boolean; onClose: () => void; title: string; children: ReactNode }) {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) dialog.showModal();
    if (!open && dialog.open) dialog.close();
  }, [open]);
  return (
    <dialog
      ref={ref}
      onClose={onClose}
      aria-label={title}
      className="m-auto w-[min(560px,calc(100vw-2rem))] rounded-[4px] border border-rule bg-chalk p-0 text-basalt backdrop:bg-basalt/30"
    >
      <div className="flex flex-col gap-3 p-4">
        <h2 className="text-[15px] font-semibold">{title}</h2>
        {children}
      </div>
    </dialog>
  );
}

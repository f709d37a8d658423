"use client";
// Dialogs on Radix's primitive (focus kept inside, Escape closes, focus returns to the opener), drawn with our
// tokens: Dialog (a titled panel), ConfirmDialog (a question with a confirm and a keep button, for writes that
// cannot be undone) and Sheet (a panel from the side, for the menu on small screens).
import * as RD from "@radix-ui/react-dialog";
import type { ReactNode } from "react";

const overlay = "fixed inset-0 z-40 bg-black/40";

export function Dialog({ trigger, title, description, children, open, onOpenChange, wide = false }: {
  trigger?: ReactNode; title: string; description?: ReactNode; children: ReactNode; open?: boolean; onOpenChange?: (o: boolean) => void; wide?: boolean;
}) {
  return (
    <RD.Root open={open} onOpenChange={onOpenChange}>
      {trigger && <RD.Trigger asChild>{trigger}</RD.Trigger>}
      <RD.Portal>
        <RD.Overlay className={overlay} />
        <RD.Content
          className={`fixed left-1/2 top-1/2 z-50 max-h-[calc(100dvh-2rem)] w-[calc(100vw-2rem)] -translate-x-1/2 -translate-y-1/2 overflow-y-auto rounded-lg border border-line bg-card p-5 text-ink shadow-xl ${wide ? "max-w-2xl" : "max-w-md"}`}
        >
          <div className="mb-3 flex items-start justify-between gap-3">
            <RD.Title className="text-lg font-semibold">{title}</RD.Title>
            <RD.Close className="btn-quiet -mr-2 -mt-1 px-2 py-1" aria-label="Close">
              <svg viewBox="0 0 16 16" className="h-4 w-4" fill="none" stroke="currentColor" strokeWidth="1.8" aria-hidden><path d="M4 4l8 8M12 4l-8 8" /></svg>
            </RD.Close>
          </div>
          {description ? <RD.Description className="mb-3 text-sm text-muted">{description}</RD.Description> : <RD.Description className="sr-only">{title}</RD.Description>}
          {children}
        </RD.Content>
      </RD.Portal>
    </RD.Root>
  );
}

/** A question before a write that cannot be undone; confirming calls onConfirm (the dialog stays open while busy). */
export function ConfirmDialog({ trigger, title, children, confirmLabel, cancelLabel = "Cancel", onConfirm, busy = false, open, onOpenChange }: {
  trigger?: ReactNode; title: string; children: ReactNode; confirmLabel: string; cancelLabel?: string; onConfirm: () => void; busy?: boolean; open?: boolean; onOpenChange?: (o: boolean) => void;
}) {
  return (
    <RD.Root open={open} onOpenChange={onOpenChange}>
      {trigger && <RD.Trigger asChild>{trigger}</RD.Trigger>}
      <RD.Portal>
        <RD.Overlay className={overlay} />
        <RD.Content role="alertdialog" className="fixed left-1/2 top-1/2 z-50 w-[calc(100vw-2rem)] max-w-md -translate-x-1/2 -translate-y-1/2 rounded-lg border border-line bg-card p-5 text-ink shadow-xl">
          <RD.Title className="text-lg font-semibold">{title}</RD.Title>
          <RD.Description asChild><div className="mt-2 text-sm">{children}</div></RD.Description>
          <div className="mt-5 flex flex-wrap justify-end gap-2">
            <RD.Close className="btn-quiet">{cancelLabel}</RD.Close>
            <button type="button" className="btn-danger" disabled={busy} onClick={onConfirm}>{confirmLabel}</button>
          </div>
        </RD.Content>
      </RD.Portal>
    </RD.Root>
  );
}

/** A panel sliding in from the right edge (the small-screen menu). */
export function Sheet({ trigger, title, children, open, onOpenChange }: { trigger: ReactNode; title: string; children: ReactNode; open?: boolean; onOpenChange?: (o: boolean) => void }) {
  return (
    <RD.Root open={open} onOpenChange={onOpenChange}>
      <RD.Trigger asChild>{trigger}</RD.Trigger>
      <RD.Portal>
        <RD.Overlay className={overlay} />
        <RD.Content className="fixed inset-y-0 right-0 z-50 flex w-[min(20rem,calc(100vw-3rem))] flex-col gap-4 overflow-y-auto border-l border-line bg-card p-5 text-ink shadow-xl">
          <div className="flex items-center justify-between">
            <RD.Title className="text-lg font-semibold">{title}</RD.Title>
            <RD.Close className="btn-quiet px-2 py-1" aria-label="Close menu">
              <svg viewBox="0 0 16 16" className="h-4 w-4" fill="none" stroke="currentColor" strokeWidth="1.8" aria-hidden><path d="M4 4l8 8M12 4l-8 8" /></svg>
            </RD.Close>
          </div>
          <RD.Description className="sr-only">Studio switcher, account and theme</RD.Description>
          {children}
        </RD.Content>
      </RD.Portal>
    </RD.Root>
  );
}

export const DialogClose = RD.Close;

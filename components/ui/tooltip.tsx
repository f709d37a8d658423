"use client";
// A short explanation on hover and keyboard focus (Radix tooltip). The child must be focusable (a button or a
// link) or is wrapped in a focusable span, so keyboard users get the text too. TooltipProvider sits once in
// components/providers.tsx.
import * as RT from "@radix-ui/react-tooltip";
import { isValidElement, type ReactNode } from "react";

export const TooltipProvider = ({ children }: { children: ReactNode }) => <RT.Provider delayDuration={300}>{children}</RT.Provider>;

export function Tip({ content, children, focusable = !isValidElement(children) }: { content: ReactNode; children: ReactNode; focusable?: boolean }) {
  return (
    <RT.Root>
      <RT.Trigger asChild>{focusable ? <span tabIndex={0} className="cursor-help">{children}</span> : children}</RT.Trigger>
      <RT.Portal>
        <RT.Content sideOffset={4} collisionPadding={8} className="z-50 max-w-xs rounded-md border border-line bg-ink px-2.5 py-1.5 text-xs text-paper shadow-lg">
          {content}
          <RT.Arrow className="fill-ink" />
        </RT.Content>
      </RT.Portal>
    </RT.Root>
  );
}

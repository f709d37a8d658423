"use client";
// In-page tabs (Radix: arrow keys move between tabs, the panel is labelled by its tab), drawn like the
// studio's section tabs. For sections that are separate pages use links (components/studio-tabs.tsx).
import * as RTabs from "@radix-ui/react-tabs";
import type { ReactNode } from "react";

export function Tabs({ label, tabs, defaultValue, value, onValueChange }: {
  label: string; tabs: { value: string; label: ReactNode; content: ReactNode }[]; defaultValue?: string; value?: string; onValueChange?: (v: string) => void;
}) {
  return (
    <RTabs.Root defaultValue={defaultValue ?? tabs[0]?.value} value={value} onValueChange={onValueChange} className="space-y-3">
      <RTabs.List aria-label={label} className="flex flex-wrap gap-1 border-b border-line">
        {tabs.map((t) => (
          <RTabs.Trigger key={t.value} value={t.value} className="-mb-px rounded-t-md border border-transparent px-3 py-2 text-sm text-muted hover:text-ink data-[state=active]:border-line data-[state=active]:border-b-card data-[state=active]:bg-card data-[state=active]:font-semibold data-[state=active]:text-ink">
            {t.label}
          </RTabs.Trigger>
        ))}
      </RTabs.List>
      {tabs.map((t) => (
        <RTabs.Content key={t.value} value={t.value} className="focus-visible:outline-2">
          {t.content}
        </RTabs.Content>
      ))}
    </RTabs.Root>
  );
}

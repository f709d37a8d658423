"use client";
// Light, dark or the system's setting. The choice is kept in localStorage ("kw-theme"); a small script in the
// document head (themeScript) applies it before the first paint, so a dark page never flashes light, and
// follows the system while the choice is "system". The page reads html[data-theme] ("light" | "dark").
import { useEffect, useState } from "react";
import { THEME_KEY as KEY } from "./theme-script";

export type ThemeChoice = "system" | "light" | "dark";

function apply() {
  (window as unknown as { __kwApplyTheme?: () => void }).__kwApplyTheme?.();
}

const CHOICES: { value: ThemeChoice; label: string; icon: React.ReactNode }[] = [
  { value: "system", label: "System", icon: <path d="M3 4h14v9H3zM7 16h6" /> },
  { value: "light", label: "Light", icon: <><circle cx="10" cy="10" r="3.5" /><path d="M10 2v2M10 16v2M2 10h2M16 10h2M4.3 4.3l1.4 1.4M14.3 14.3l1.4 1.4M4.3 15.7l1.4-1.4M14.3 5.7l1.4-1.4" /></> },
  { value: "dark", label: "Dark", icon: <path d="M15.5 12.5A6.5 6.5 0 0 1 7.5 4.5a6.5 6.5 0 1 0 8 8z" /> },
];

/** Three small radio buttons (system / light / dark); the choice is remembered on this device. */
export function ThemeSwitch({ className = "" }: { className?: string }) {
  const [choice, setChoice] = useState<ThemeChoice>("system");
  useEffect(() => {
    const v = document.documentElement.dataset.themeChoice;
    if (v === "light" || v === "dark" || v === "system") setChoice(v);
  }, []);
  const pick = (v: ThemeChoice) => {
    setChoice(v);
    try {
      if (v === "system") localStorage.removeItem(KEY);
      else localStorage.setItem(KEY, v);
    } catch {
      /* storage refused (private mode): the choice holds for this page only */
      document.documentElement.dataset.theme = v === "system" ? (matchMedia("(prefers-color-scheme: dark)").matches ? "dark" : "light") : v;
    }
    apply();
  };
  return (
    <fieldset className={`inline-flex rounded-md border border-line bg-paper p-0.5 ${className}`} data-testid="theme-switch">
      <legend className="sr-only">Colour theme</legend>
      {CHOICES.map((c) => (
        <label key={c.value} title={`${c.label} theme`} className={`flex cursor-pointer items-center gap-1 rounded px-1.5 py-1 text-xs has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-brand ${choice === c.value ? "bg-card font-medium text-ink shadow-sm" : "text-muted hover:text-ink"}`}>
          <input type="radio" name="kw-theme" value={c.value} checked={choice === c.value} onChange={() => pick(c.value)} className="sr-only" />
          <svg viewBox="0 0 20 20" className="h-4 w-4" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" aria-hidden>{c.icon}</svg>
          <span className="sr-only">{c.label}</span>
        </label>
      ))}
    </fieldset>
  );
}

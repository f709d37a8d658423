"use client";
// The octave convention setting for note names (middle C = C3 or C4): a per-user choice kept in this browser
// (localStorage), read by every page that shows note names.
import { useCallback, useEffect, useState } from "react";
import type { MiddleC } from "./note-name";
import { Select } from "@/components/ui/select";
export { noteName, type MiddleC } from "./note-name";

const KEY = "kw.middleC";

export function useMiddleC(): [MiddleC, (m: MiddleC) => void] {
  const [m, setM] = useState<MiddleC>("C4");
  useEffect(() => {
    const v = localStorage.getItem(KEY);
    if (v === "C3" || v === "C4") setM(v);
    const onStorage = (e: StorageEvent) => { if (e.key === KEY && (e.newValue === "C3" || e.newValue === "C4")) setM(e.newValue); };
    window.addEventListener("storage", onStorage);
    return () => window.removeEventListener("storage", onStorage);
  }, []);
  const set = useCallback((v: MiddleC) => { localStorage.setItem(KEY, v); setM(v); }, []);
  return [m, set];
}

export function MiddleCSetting({ value, onChange }: { value: MiddleC; onChange: (m: MiddleC) => void }) {
  return (
    <label className="inline-flex items-center gap-2 text-sm">
      <span className="text-muted">Note names: middle C (note 60) is</span>
      <Select className="field w-auto py-1" value={value} onChange={(e) => onChange(e.target.value as MiddleC)} aria-label="Octave convention">
        <option value="C3">C3</option>
        <option value="C4">C4</option>
      </Select>
    </label>
  );
}

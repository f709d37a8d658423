"use client";
// The one select of the app: Radix's accessible listbox (keyboard, type-ahead, screen readers) drawn with
// our tokens, written like a native <select> so pages keep their markup: <option> and <optgroup> children,
// `id` for <label htmlFor>, `name` for forms, `value`/`defaultValue`, and `onChange` receiving
// `{ target: { value } }` (or `onValueChange(value)`). The trigger carries `data-value` (the current value,
// "" for none) so tests read what is chosen. Radix does not allow "" as an item value; it is mapped inside.
import * as RS from "@radix-ui/react-select";
import { Children, Fragment, isValidElement, useState, type ReactElement, type ReactNode } from "react";

const EMPTY = "__kw-empty__";
const toRadix = (v: string) => (v === "" ? EMPTY : v);
const fromRadix = (v: string) => (v === EMPTY ? "" : v);

type Opt = { value: string; label: string; disabled?: boolean };
type Group = { label: string; options: Opt[] };

function text(node: ReactNode): string {
  if (node === null || node === undefined || typeof node === "boolean") return "";
  if (typeof node === "string" || typeof node === "number") return String(node);
  if (Array.isArray(node)) return node.map(text).join("");
  if (isValidElement<{ children?: ReactNode }>(node)) return text(node.props.children);
  return "";
}

/** Flatten <option>/<optgroup> children (arrays and fragments included) into groups of options. */
function parse(children: ReactNode): Group[] {
  const groups: Group[] = [];
  let loose: Group | null = null;
  const walk = (nodes: ReactNode) => {
    for (const c of Children.toArray(nodes)) {
      if (!isValidElement(c)) continue;
      const el = c as ReactElement<{ value?: string | number; children?: ReactNode; disabled?: boolean; label?: string }>;
      if (el.type === Fragment) walk(el.props.children);
      else if (el.type === "optgroup") {
        loose = null;
        const g: Group = { label: el.props.label ?? "", options: [] };
        for (const o of Children.toArray(el.props.children)) {
          if (!isValidElement(o)) continue;
          const op = o as ReactElement<{ value?: string | number; children?: ReactNode; disabled?: boolean }>;
          g.options.push({ value: String(op.props.value ?? text(op.props.children)), label: text(op.props.children), disabled: op.props.disabled });
        }
        groups.push(g);
      } else if (el.type === "option") {
        if (!loose) groups.push((loose = { label: "", options: [] }));
        loose.options.push({ value: String(el.props.value ?? text(el.props.children)), label: text(el.props.children), disabled: el.props.disabled });
      }
    }
  };
  walk(children);
  return groups;
}

export interface SelectProps {
  id?: string;
  name?: string;
  value?: string | number;
  defaultValue?: string | number;
  onChange?: (e: { target: { value: string } }) => void;
  onValueChange?: (value: string) => void;
  disabled?: boolean;
  required?: boolean;
  className?: string;
  placeholder?: string;
  children: ReactNode;
  "aria-label"?: string;
  "aria-describedby"?: string;
  "aria-invalid"?: boolean;
  "data-testid"?: string;
}

export function Select({ id, name, value, defaultValue, onChange, onValueChange, disabled, required, className = "", placeholder, children, ...aria }: SelectProps) {
  const groups = parse(children);
  const natural = /(^|\s)w-auto(\s|$)/.test(className);
  const controlled = value !== undefined;
  const [own, setOwn] = useState(String(defaultValue ?? ""));
  const current = controlled ? String(value) : own;
  const change = (v: string) => {
    const real = fromRadix(v);
    if (!controlled) setOwn(real);
    onValueChange?.(real);
    onChange?.({ target: { value: real } });
  };
  return (
    <RS.Root value={toRadix(current)} onValueChange={change} disabled={disabled} required={required} name={name}>
      <RS.Trigger
        id={id}
        data-value={current}
        {...aria}
        className={`field flex min-h-[2.25rem] items-center justify-between gap-2 text-left data-[disabled]:cursor-not-allowed data-[disabled]:opacity-60 data-[placeholder]:text-muted ${className}`}
      >
        {/* a select as wide as its box lets a long choice be cut with an ellipsis instead of widening the page;
            one sized to its content (w-auto) shows the whole choice */}
        <span className={natural ? "min-w-0 truncate" : "w-0 min-w-0 flex-1 truncate"}><RS.Value placeholder={placeholder} /></span>
        <RS.Icon asChild>
          <svg viewBox="0 0 16 16" className="h-4 w-4 shrink-0 text-muted" fill="none" stroke="currentColor" strokeWidth="1.6" aria-hidden><path d="M4 6l4 4 4-4" /></svg>
        </RS.Icon>
      </RS.Trigger>
      <RS.Portal>
        <RS.Content
          position="popper"
          sideOffset={4}
          collisionPadding={8}
          className="z-50 max-h-[min(24rem,var(--radix-select-content-available-height))] min-w-[var(--radix-select-trigger-width)] max-w-[calc(100vw-1rem)] overflow-hidden rounded-md border border-line bg-card text-sm text-ink shadow-lg"
        >
          <RS.ScrollUpButton className="flex justify-center py-1 text-muted">▲</RS.ScrollUpButton>
          <RS.Viewport className="p-1">
            {groups.map((g, gi) => (
              <RS.Group key={`${g.label}-${gi}`}>
                {g.label && <RS.Label className="px-2 pb-1 pt-2 text-xs font-semibold text-muted">{g.label}</RS.Label>}
                {g.options.map((o) => (
                  <RS.Item
                    key={o.value}
                    value={toRadix(o.value)}
                    disabled={o.disabled}
                    data-value={o.value}
                    className="relative flex cursor-default select-none items-center rounded py-1.5 pl-7 pr-3 outline-none data-[disabled]:text-muted data-[highlighted]:bg-brand-soft data-[highlighted]:text-ink"
                  >
                    <RS.ItemIndicator className="absolute left-2 inline-flex">
                      <svg viewBox="0 0 16 16" className="h-3.5 w-3.5 text-brand" fill="none" stroke="currentColor" strokeWidth="2" aria-hidden><path d="M3 8.5l3 3 7-7" /></svg>
                    </RS.ItemIndicator>
                    <RS.ItemText>{o.label}</RS.ItemText>
                  </RS.Item>
                ))}
              </RS.Group>
            ))}
          </RS.Viewport>
          <RS.ScrollDownButton className="flex justify-center py-1 text-muted">▼</RS.ScrollDownButton>
        </RS.Content>
      </RS.Portal>
    </RS.Root>
  );
}

/**
 * `v-control-aria`: puts a form field's aria attributes (aria-invalid, aria-describedby,
 * aria-label …) on the element that takes the keyboard. ant-design's Select passes such
 * attributes to its outer box, not to the combobox input inside it, so a screen reader would
 * not read them with the field; on any other element the directive sets them on the element
 * itself. An attribute given as undefined is removed.
 *
 *   <Select :id="control.id" v-control-aria="control" … />
 */
import type { Directive } from 'vue';

export type ControlAria = Record<string, string | undefined>;

/** The element a Select's aria attributes belong to: its combobox input, else the element. */
function keyboardTarget(el: HTMLElement): HTMLElement {
  if (el.matches('input, textarea, button, [role="combobox"]')) return el;
  return el.querySelector<HTMLElement>('input[role="combobox"], [role="combobox"]') ?? el;
}

function apply(el: HTMLElement, value: ControlAria | undefined): void {
  const target = keyboardTarget(el);
  for (const [name, v] of Object.entries(value ?? {})) {
    if (!name.startsWith('aria-')) continue;
    if (v === undefined) target.removeAttribute(name);
    else target.setAttribute(name, v);
    // The outer box of a Select keeps no copy (a second, stale description).
    if (target !== el) el.removeAttribute(name);
  }
}

export const vControlAria: Directive<HTMLElement, ControlAria | undefined> = {
  mounted: (el, binding) => apply(el, binding.value),
  updated: (el, binding) => apply(el, binding.value),
};

/**
 * Checks of a rendered form's fields as a screen reader meets them (used by the client tests):
 * every control has a name tied to it, and a field with a problem is marked invalid and
 * described by the text of its problem, in a region that is announced.
 *
 * The name follows the order of the W3C "Accessible Name and Description Computation 1.2"
 * (section 4.3.2), cut down to what these forms use: aria-labelledby (the text of every
 * element it names), else aria-label, else a <label for=id>, else an enclosing <label>.
 * A placeholder or a title is not counted: a placeholder goes away as the user types.
 */

/** The element's text as a screen reader reads it: its text, spaces squeezed. */
function textOf(el: Element): string {
  return (el.textContent ?? '').replace(/\s+/g, ' ').trim();
}

function byId(doc: Document, id: string): Element | null {
  return doc.getElementById(id);
}

export interface NameFound {
  name: string;
  /** Where the name comes from. */
  source: 'aria-labelledby' | 'aria-label' | 'label[for]' | 'enclosing label' | 'none';
}

export function accessibleName(el: Element): NameFound {
  const doc = el.ownerDocument;
  const labelledBy = el.getAttribute('aria-labelledby');
  if (labelledBy) {
    const parts = labelledBy.split(/\s+/).map((id) => byId(doc, id));
    // every id must name an element on the page, or the name is broken
    if (parts.every((p) => p !== null)) return { name: parts.map((p) => textOf(p!)).join(' ').trim(), source: 'aria-labelledby' };
    return { name: '', source: 'none' };
  }
  const ariaLabel = el.getAttribute('aria-label')?.trim();
  if (ariaLabel) return { name: ariaLabel, source: 'aria-label' };
  if (el.id) {
    const labels = [...doc.querySelectorAll('label')].filter((l) => l.htmlFor === el.id);
    const text = labels.map(textOf).join(' ').trim();
    if (text) return { name: text, source: 'label[for]' };
  }
  const wrapping = el.closest('label');
  if (wrapping && textOf(wrapping)) return { name: textOf(wrapping), source: 'enclosing label' };
  return { name: '', source: 'none' };
}

/**
 * Every control a user fills or chooses in `root`: text boxes, number boxes, text areas,
 * selects (ant-design's combobox input), radio buttons and check boxes, switches; and every
 * group of radio buttons or check boxes. An input hidden with display:none (the file input
 * inside ant-design's upload button, which the button itself stands for) is not in the
 * accessibility tree and is left out.
 */
export function formControls(root: Element): Element[] {
  const inputs = [...root.querySelectorAll('input, textarea, select, button[role="switch"]')].filter((el) => {
    if (el instanceof HTMLInputElement && el.type === 'hidden') return false;
    return !(el instanceof HTMLElement && el.style.display === 'none');
  });
  const groups = [...root.querySelectorAll('.ant-radio-group, .ant-checkbox-group')];
  return [...inputs, ...groups];
}

/** A short description of a control for a failing test's message. */
export function describeControl(el: Element): string {
  const test = el.getAttribute('data-test') ?? el.closest('[data-test]')?.getAttribute('data-test');
  const field = el.closest('[data-field]')?.getAttribute('data-field');
  return `<${el.tagName.toLowerCase()}${el.id ? ` id=${el.id}` : ''}${el.getAttribute('role') ? ` role=${el.getAttribute('role')}` : ''}>${test ? ` [data-test=${test}]` : ''}${field ? ` [data-field=${field}]` : ''}`;
}

/** Controls of `root` without a name, described; empty when every one has a name. */
export function unnamedControls(root: Element): string[] {
  const out: string[] = [];
  for (const el of formControls(root)) {
    const isGroup = el.matches('.ant-radio-group, .ant-checkbox-group');
    const { name } = accessibleName(el);
    if (!name) out.push(`${describeControl(el)} has no accessible name`);
    // a group is only read as one, with its name, when it has a group role
    if (isGroup && !['radiogroup', 'group'].includes(el.getAttribute('role') ?? '')) out.push(`${describeControl(el)} has no group role`);
  }
  return out;
}

/** Ids used more than once in `root` (a label's `for` or a description would find the wrong one). */
export function duplicateIds(root: Element): string[] {
  const seen = new Map<string, number>();
  for (const el of root.querySelectorAll('[id]')) seen.set(el.id, (seen.get(el.id) ?? 0) + 1);
  return [...seen].filter(([, n]) => n > 1).map(([id]) => id);
}

/** The text of the elements `el` is described by (aria-describedby), joined. */
export function descriptionOf(el: Element): string {
  const ids = el.getAttribute('aria-describedby')?.split(/\s+/).filter(Boolean) ?? [];
  return ids.map((id) => byId(el.ownerDocument, id)).filter((e): e is Element => e !== null).map(textOf).join(' ');
}

/** The described-by elements of `el` that sit in an announced region (role="alert"). */
export function announcedDescriptions(el: Element): string[] {
  const ids = el.getAttribute('aria-describedby')?.split(/\s+/).filter(Boolean) ?? [];
  return ids
    .map((id) => byId(el.ownerDocument, id))
    .filter((e): e is Element => e !== null && e.closest('[role="alert"]') !== null)
    .map(textOf);
}

/** The control a form item holds: the element carrying the label's id, or its group. */
function controlOfItem(item: Element): Element | null {
  const forId = item.querySelector('.ant-form-item-label label')?.getAttribute('for');
  if (forId) return item.querySelector(`[id="${forId}"]`);
  return item.querySelector('[role="radiogroup"], [role="group"]');
}

/**
 * Fields of `root` shown with a problem (ant-design's `has-error` items) whose control is not
 * marked aria-invalid="true" or not described by the problem's text in an announced region;
 * and controls marked invalid that show no problem. Empty when all are right.
 */
export function untiedProblems(root: Element): string[] {
  const out: string[] = [];
  const items = [...root.querySelectorAll('.ant-form-item-has-error')];
  for (const item of items) {
    const explain = item.querySelector('.ant-form-item-explain');
    const problem = explain ? textOf(explain) : '';
    const control = controlOfItem(item);
    if (!control) {
      out.push(`a field with the problem "${problem}" has no control tied to its label`);
      continue;
    }
    if (control.getAttribute('aria-invalid') !== 'true') out.push(`${describeControl(control)} shows "${problem}" but is not aria-invalid`);
    if (!announcedDescriptions(control).includes(problem)) {
      out.push(`${describeControl(control)} shows "${problem}" but is described by "${descriptionOf(control)}" (announced: ${JSON.stringify(announcedDescriptions(control))})`);
    }
  }
  for (const el of root.querySelectorAll('[aria-invalid="true"]')) {
    if (announcedDescriptions(el).join('').trim() === '') out.push(`${describeControl(el)} is aria-invalid with no announced problem describing it`);
  }
  return out;
}

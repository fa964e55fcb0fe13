/** Small DOM helpers: elements with attributes and children, text tables, and clearing a container. */

type Child = Node | string | null | undefined | false;

export function el<K extends keyof HTMLElementTagNameMap>(
  tag: K,
  attributes: Record<string, string | number | boolean | null | undefined> = {},
  ...children: Child[]
): HTMLElementTagNameMap[K] {
  const element = document.createElement(tag);
  for (const [name, value] of Object.entries(attributes)) {
    if (value === null || value === undefined || value === false) continue;
    if (name === 'class') element.className = String(value);
    else if (value === true) element.setAttribute(name, '');
    else element.setAttribute(name, String(value));
  }
  for (const child of children) {
    if (child === null || child === undefined || child === false) continue;
    element.append(typeof child === 'string' ? document.createTextNode(child) : child);
  }
  return element;
}

/** A <select> offering `choices`, each [value, label], in their order. */
export function select(attributes: Parameters<typeof el>[1], choices: readonly (readonly [string, string])[]): HTMLSelectElement {
  return el('select', attributes, ...choices.map(([value, label]) => el('option', { value }, label)));
}

export function clear(container: Element, ...children: Child[]): void {
  container.replaceChildren();
  for (const child of children) {
    if (child === null || child === undefined || child === false) continue;
    container.append(typeof child === 'string' ? document.createTextNode(child) : child);
  }
}

/** A data table with a caption; the first column is a row header. */
export function textTable(caption: string, head: readonly string[], rows: readonly (readonly string[])[]): HTMLTableElement {
  return el(
    'table',
    { class: 'data-table' },
    el('caption', {}, caption),
    el('thead', {}, el('tr', {}, ...head.map((cell) => el('th', { scope: 'col' }, cell)))),
    el('tbody', {}, ...rows.map((row) => el('tr', {}, ...row.map((cell, k) => (k === 0 ? el('th', { scope: 'row' }, cell) : el('td', {}, cell)))))),
  );
}

let fieldCounter = 0;

/** A labelled form field: <label for> + control + optional hint (linked by aria-describedby). */
export function field(label: string, control: HTMLElement, hint?: string): HTMLElement {
  fieldCounter += 1;
  const id = control.id || `field-${fieldCounter}`;
  control.id = id;
  const hintElement = hint ? el('span', { class: 'field-hint', id: `${id}-hint` }, hint) : null;
  if (hintElement) control.setAttribute('aria-describedby', hintElement.id);
  return el('div', { class: 'field' }, el('label', { for: id }, label), control, hintElement);
}

/** A message box: role alert for errors, status for the rest. */
export function message(kind: 'error' | 'info' | 'warning', text: string): HTMLElement {
  return el('p', { class: `message message-${kind}`, role: kind === 'error' ? 'alert' : 'status' }, text);
}

/**
 * A delete button that asks before acting, in place (no browser dialog): the first press shows the question with
 * "Yes, delete" and "Keep it"; focus moves to "Keep it" so a second Enter does not delete by accident.
 */
export function confirmButton(label: string, question: string, onConfirm: () => Promise<void>, attributes: Record<string, string> = {}): HTMLElement {
  const box = el('span', { class: 'confirm-box' });
  const start = el('button', { type: 'button', class: 'button button-small button-danger', ...attributes }, label);
  const showStart = () => box.replaceChildren(start);
  start.addEventListener('click', () => {
    const yes = el('button', { type: 'button', class: 'button button-small button-danger', 'data-confirm': 'yes' }, 'Yes, delete');
    const no = el('button', { type: 'button', class: 'button button-small', 'data-confirm': 'no' }, 'Keep it');
    const status = el('span', { role: 'alert', class: 'confirm-question' }, question);
    no.addEventListener('click', () => {
      showStart();
      start.focus();
    });
    yes.addEventListener('click', async () => {
      yes.disabled = true;
      no.disabled = true;
      try {
        await onConfirm();
      } catch (error) {
        box.replaceChildren(start, message('error', error instanceof Error ? error.message : String(error)));
      }
    });
    box.replaceChildren(status, ' ', yes, ' ', no);
    no.focus();
  });
  showStart();
  return box;
}

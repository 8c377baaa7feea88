/**
 * A small element builder. Text is always set as text (textContent), never parsed as markup:
 * every title, label and note a user typed is shown as the characters they typed.
 */
export type Child = Node | string | null | undefined | false;

export function h<K extends keyof HTMLElementTagNameMap>(
  tag: K,
  attrs: Readonly<Record<string, string | number | boolean | undefined>> = {},
  children: readonly Child[] = [],
): HTMLElementTagNameMap[K] {
  const el = document.createElement(tag);
  for (const [name, value] of Object.entries(attrs)) {
    if (value === undefined || value === false) continue;
    if (name === 'text') el.textContent = String(value);
    else if (value === true) el.setAttribute(name, '');
    else el.setAttribute(name, String(value));
  }
  for (const c of children) if (c !== null && c !== undefined && c !== false) el.append(typeof c === 'string' ? document.createTextNode(c) : c);
  return el;
}

/** Replace the children of `el`. */
export function fill(el: Element, children: readonly Child[]): void {
  el.replaceChildren(...children.filter((c): c is Node | string => c !== null && c !== undefined && c !== false));
}

/** The page element with this id (the page's fixed elements, src/desk/index.html). */
export function byId<T extends HTMLElement>(id: string): T {
  return document.getElementById(id) as T;
}

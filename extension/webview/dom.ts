/**
 * Builds DOM nodes. Text goes in through `textContent` only, attributes through `setAttribute`;
 * nothing here parses HTML, so no value from a message can become markup.
 */
export interface ElementProps {
  readonly className?: string;
  readonly text?: string;
  readonly attrs?: Readonly<Record<string, string>>;
}

export function h<K extends keyof HTMLElementTagNameMap>(tag: K, props: ElementProps = {}, children: ReadonlyArray<Node | null> = []): HTMLElementTagNameMap[K] {
  const el = document.createElement(tag);
  if (props.className) el.className = props.className;
  if (props.text !== undefined) el.textContent = props.text;
  for (const [name, value] of Object.entries(props.attrs ?? {})) el.setAttribute(name, value);
  for (const child of children) if (child) el.appendChild(child);
  return el;
}

/** Makes an element act as a button for the mouse and the keyboard (Enter, Space). */
export function onActivate(el: HTMLElement, action: () => void): void {
  el.addEventListener('click', action);
  el.addEventListener('keydown', (event) => {
    if (event.key === 'Enter' || event.key === ' ') {
      event.preventDefault();
      action();
    }
  });
}

import { useLayoutEffect, type RefObject } from 'react';

/**
 * Keeps what a person typed or chose in a server-rendered form before its island hydrated.
 *
 * The page arrives with the form already drawn, so people type at once; the island's script may still be
 * loading. React then hydrates a controlled field without touching the text in it, but its state still
 * holds the value the server rendered, and the field's next render (the first comes right after hydration)
 * writes that value back: the text is lost. So, once, as the island mounts, every named field inside
 * `container` whose current value differs from the value it was rendered with (`defaultValue`,
 * `defaultChecked`, `defaultSelected` — what the HTML said) is handed to `adopt(name, value)`, which puts
 * it into the component's state. Fields the person did not touch are not reported.
 */
export function useKeepEarlyInput(container: RefObject<HTMLElement | null>, adopt: (name: string, value: string) => void): void {
  useLayoutEffect(() => {
    const root = container.current;
    if (!root) return;
    for (const el of Array.from(root.querySelectorAll<HTMLInputElement | HTMLTextAreaElement | HTMLSelectElement>('input[name], textarea[name], select[name]'))) {
      if (el instanceof HTMLInputElement && (el.type === 'radio' || el.type === 'checkbox')) {
        if (el.checked && !el.defaultChecked) adopt(el.name, el.value);
      } else if (el instanceof HTMLSelectElement) {
        const chosen = el.selectedOptions[0];
        if (chosen && !chosen.defaultSelected && el.options.length > 0 && Array.from(el.options).some((o) => o.defaultSelected)) adopt(el.name, el.value);
      } else if (el.value !== el.defaultValue) {
        adopt(el.name, el.value);
      }
    }
    // Once, at hydration: later changes go through the fields' own handlers.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, []);
}

import { screen } from '@testing-library/react';

/** The helper or error text a field points to through aria-describedby. */
export function descriptionOf(label: string): string | null {
  const ids = screen.getByLabelText(label).getAttribute('aria-describedby');
  if (!ids) return null;
  return ids
    .split(/\s+/)
    .map((id) => document.getElementById(id)?.textContent ?? '')
    .join(' ')
    .trim();
}

/** True when the field is marked invalid for assistive technology. */
export function isInvalid(label: string): boolean {
  return screen.getByLabelText(label).getAttribute('aria-invalid') === 'true';
}

import { useState, type ReactNode } from 'react';
import type { CustomerView } from '../api/get-customers';
import { CustomerFormDialog } from './customer-form-dialog';

/**
 * "New customer…" for a customer picker: `open(choose)` shows the new-customer form and calls
 * `choose` with the saved customer, so the picker selects it. Render `dialog` once.
 */
export function useNewCustomerPicker(): {
  open: (choose: (customer: { id: number; name: string }) => void) => void;
  dialog: ReactNode;
} {
  const [choose, setChoose] = useState<((c: CustomerView) => void) | null>(null);
  return {
    open: (fn) => setChoose(() => fn),
    dialog: choose && (
      <CustomerFormDialog open customer={null} onClose={() => setChoose(null)} onSaved={(c) => choose(c)} />
    ),
  };
}

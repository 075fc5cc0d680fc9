import type { TextFieldProps } from '@mui/material/TextField';
import type { Control, FieldPath, FieldValues, RegisterOptions } from 'react-hook-form';
import { FormTextField } from './form-text-field';

export interface SelectOption {
  value: string;
  label: string;
}

type FormSelectFieldProps<T extends FieldValues, TOut extends FieldValues = T> = {
  /** A form's control; the form may hand its submit handler parsed values (a schema resolver). */
  control: Control<T, unknown, TOut>;
  name: FieldPath<T>;
  label: string;
  options: readonly SelectOption[];
  /** First entry with an empty value, e.g. "Choose…"; none when omitted. */
  placeholder?: string;
  rules?: RegisterOptions<T, FieldPath<T>>;
  /** A last entry that creates a record instead of choosing one (e.g. "New customer…"). */
  createOption?: { label: string; onCreate: () => void };
} & Pick<TextFieldProps, 'disabled' | 'fullWidth' | 'size' | 'helperText' | 'sx'>;

/** Label of the create entry of every customer picker. */
export const NEW_CUSTOMER_OPTION = 'New customer…';

/** Value of the create entry; never a record's id. */
const CREATE_VALUE = '__create__';

/** A native select bound to a react-hook-form field (keyboard-friendly and plain to test). */
export function FormSelectField<T extends FieldValues, TOut extends FieldValues = T>({
  options,
  placeholder,
  createOption,
  ...props
}: FormSelectFieldProps<T, TOut>) {
  const intercept = (value: string) => {
    if (!createOption || value !== CREATE_VALUE) return false;
    createOption.onCreate();
    return true;
  };
  return (
    <FormTextField
      {...props}
      select
      interceptChange={intercept}
      slotProps={{ select: { native: true }, inputLabel: { shrink: true } }}
    >
      {placeholder !== undefined && <option value="">{placeholder}</option>}
      {options.map((o) => (
        <option key={o.value} value={o.value}>
          {o.label}
        </option>
      ))}
      {createOption && <option value={CREATE_VALUE}>{createOption.label}</option>}
    </FormTextField>
  );
}

/** Options for records with an id and a name (customers, materials). */
export function namedOptions(items: readonly { id: number; name: string }[]): SelectOption[] {
  return items.map((item) => ({ value: String(item.id), label: item.name }));
}

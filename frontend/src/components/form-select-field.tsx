import type { TextFieldProps } from '@mui/material/TextField';
import type { Control, FieldPath, FieldValues, RegisterOptions } from 'react-hook-form';
import { FormTextField } from './form-text-field';

export interface SelectOption {
  value: string;
  label: string;
}

type FormSelectFieldProps<T extends FieldValues> = {
  control: Control<T>;
  name: FieldPath<T>;
  label: string;
  options: readonly SelectOption[];
  /** First entry with an empty value, e.g. "Choose…"; none when omitted. */
  placeholder?: string;
  rules?: RegisterOptions<T, FieldPath<T>>;
} & Pick<TextFieldProps, 'disabled' | 'fullWidth' | 'size' | 'helperText' | 'sx'>;

/** A native select bound to a react-hook-form field (keyboard-friendly and plain to test). */
export function FormSelectField<T extends FieldValues>({
  options,
  placeholder,
  ...props
}: FormSelectFieldProps<T>) {
  return (
    <FormTextField {...props} select slotProps={{ select: { native: true }, inputLabel: { shrink: true } }}>
      {placeholder !== undefined && <option value="">{placeholder}</option>}
      {options.map((o) => (
        <option key={o.value} value={o.value}>
          {o.label}
        </option>
      ))}
    </FormTextField>
  );
}

/** Options for records with an id and a name (customers, materials). */
export function namedOptions(items: readonly { id: number; name: string }[]): SelectOption[] {
  return items.map((item) => ({ value: String(item.id), label: item.name }));
}

import Checkbox from '@mui/material/Checkbox';
import FormControlLabel from '@mui/material/FormControlLabel';
import { Controller, type Control, type FieldPath, type FieldValues } from 'react-hook-form';

interface FormCheckboxFieldProps<T extends FieldValues, TOut extends FieldValues = T> {
  /** A form's control; the form may hand its submit handler parsed values (a schema resolver). */
  control: Control<T, unknown, TOut>;
  name: FieldPath<T>;
  label: string;
}

/** A labelled checkbox bound to a boolean react-hook-form field. */
export function FormCheckboxField<T extends FieldValues, TOut extends FieldValues = T>({
  control,
  name,
  label,
}: FormCheckboxFieldProps<T, TOut>) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field }) => (
        <FormControlLabel
          control={
            <Checkbox checked={Boolean(field.value)} onChange={(e) => field.onChange(e.target.checked)} />
          }
          label={label}
        />
      )}
    />
  );
}

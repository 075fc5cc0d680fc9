import Checkbox from '@mui/material/Checkbox';
import FormControlLabel from '@mui/material/FormControlLabel';
import { Controller, type Control, type FieldPath, type FieldValues } from 'react-hook-form';

interface FormCheckboxFieldProps<T extends FieldValues> {
  control: Control<T>;
  name: FieldPath<T>;
  label: string;
}

/** A labelled checkbox bound to a boolean react-hook-form field. */
export function FormCheckboxField<T extends FieldValues>({
  control,
  name,
  label,
}: FormCheckboxFieldProps<T>) {
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

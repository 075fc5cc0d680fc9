import TextField, { type TextFieldProps } from '@mui/material/TextField';
import {
  useController,
  type Control,
  type FieldPath,
  type FieldValues,
  type RegisterOptions,
} from 'react-hook-form';

type FormTextFieldProps<T extends FieldValues, TOut extends FieldValues = T> = Omit<
  TextFieldProps,
  'name' | 'value' | 'onChange' | 'onBlur' | 'error' | 'inputRef' | 'defaultValue'
> & {
  /** A form's control; the form may hand its submit handler parsed values (a schema resolver). */
  control: Control<T, unknown, TOut>;
  name: FieldPath<T>;
  rules?: RegisterOptions<T, FieldPath<T>>;
  /** Sees each typed or chosen value first; returning true keeps it out of the form. */
  interceptChange?: (value: string) => boolean;
};

/** A MUI text field bound to a react-hook-form field; the rule's message shows as helper text. */
export function FormTextField<T extends FieldValues, TOut extends FieldValues = T>({
  control,
  name,
  rules,
  helperText,
  interceptChange,
  ...textFieldProps
}: FormTextFieldProps<T, TOut>) {
  const { field, fieldState } = useController({ control, name, rules });
  return (
    <TextField
      {...textFieldProps}
      name={field.name}
      value={field.value ?? ''}
      onChange={(e) => {
        if (!interceptChange?.(e.target.value)) field.onChange(e);
      }}
      onBlur={field.onBlur}
      inputRef={field.ref}
      disabled={field.disabled || textFieldProps.disabled}
      error={Boolean(fieldState.error)}
      helperText={fieldState.error?.message ?? helperText}
    />
  );
}

import type { TextFieldProps } from '@mui/material/TextField';
import type { Control, FieldPath, FieldValues } from 'react-hook-form';
import { MIN_PASSWORD_LENGTH, newPasswordRules } from '../lib/validation';
import { FormTextField } from './form-text-field';

type NewPasswordFieldProps<T extends FieldValues> = {
  control: Control<T>;
  name: FieldPath<T>;
  label: string;
  /** Said after the length rule in the helper text. */
  hint?: string;
} & Pick<TextFieldProps, 'autoFocus' | 'fullWidth'>;

/** A password being set (own, initial or reset), with the API's length rules. */
export function NewPasswordField<T extends FieldValues>({ hint, ...props }: NewPasswordFieldProps<T>) {
  return (
    <FormTextField
      {...props}
      rules={newPasswordRules}
      type="password"
      autoComplete="new-password"
      helperText={
        hint
          ? `At least ${MIN_PASSWORD_LENGTH} characters; ${hint}`
          : `At least ${MIN_PASSWORD_LENGTH} characters`
      }
    />
  );
}

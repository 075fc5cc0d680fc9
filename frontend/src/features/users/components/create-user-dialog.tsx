import { ROLES, isRole } from '@quietglass/shared';
import { useForm } from 'react-hook-form';
import { ErrorAlert } from '../../../components/error-alert';
import { FormDialog } from '../../../components/form-dialog';
import { FormTextField } from '../../../components/form-text-field';
import { NewPasswordField } from '../../../components/new-password-field';
import { notify } from '../../../lib/notifier';
import { ROLE_LABELS } from '../../../lib/roles';
import { displayNameRules, emailRules } from '../../../lib/validation';
import { useCreateUser } from '../api/create-user';

interface CreateUserValues {
  email: string;
  displayName: string;
  role: string;
  password: string;
}

const EMPTY: CreateUserValues = { email: '', displayName: '', role: '', password: '' };

interface CreateUserDialogProps {
  open: boolean;
  onClose: () => void;
}

/** New account: e-mail, display name, role and an initial password the owner changes later. */
export function CreateUserDialog({ open, onClose }: CreateUserDialogProps) {
  const createUser = useCreateUser();
  const { control, handleSubmit, reset } = useForm<CreateUserValues>({ defaultValues: EMPTY });

  const close = () => {
    reset(EMPTY);
    createUser.reset();
    onClose();
  };

  const onSubmit = handleSubmit((values) => {
    if (!isRole(values.role)) return;
    createUser.mutate(
      {
        email: values.email.trim(),
        displayName: values.displayName.trim(),
        role: values.role,
        password: values.password,
      },
      {
        onSuccess: (user) => {
          notify(`Account created for ${user.email}.`, 'success');
          close();
        },
      },
    );
  });

  return (
    <FormDialog
      open={open}
      title="New user"
      submitLabel="Create user"
      pending={createUser.isPending}
      onSubmit={onSubmit}
      onClose={close}
    >
      {createUser.error && <ErrorAlert error={createUser.error} />}
      <FormTextField
        control={control}
        name="email"
        rules={emailRules}
        label="E-mail"
        type="email"
        autoComplete="off"
        fullWidth
        sx={{ mt: 1 }}
      />
      <FormTextField
        control={control}
        name="displayName"
        rules={displayNameRules}
        label="Display name"
        fullWidth
      />
      <FormTextField
        control={control}
        name="role"
        rules={{ validate: (value) => isRole(value) || 'Choose a role' }}
        label="Role"
        select
        slotProps={{ select: { native: true }, inputLabel: { shrink: true } }}
        fullWidth
      >
        <option value="">Choose a role</option>
        {ROLES.map((role) => (
          <option key={role} value={role}>
            {ROLE_LABELS[role]}
          </option>
        ))}
      </FormTextField>
      <NewPasswordField
        control={control}
        name="password"
        label="Initial password"
        hint="the user should change it after signing in"
        fullWidth
      />
    </FormDialog>
  );
}

import Button from '@mui/material/Button';
import NativeSelect from '@mui/material/NativeSelect';
import Switch from '@mui/material/Switch';
import { DataGrid, type GridColDef } from '@mui/x-data-grid';
import { ROLES, isRole, type UserView } from '@quietglass/shared';
import { useMemo, useState } from 'react';
import { ConfirmDialog } from '../../../components/confirm-dialog';
import { ErrorAlert } from '../../../components/error-alert';
import { formatDateTime } from '../../../lib/format';
import { notify } from '../../../lib/notifier';
import { ROLE_LABELS } from '../../../lib/roles';
import { useUsers } from '../api/get-users';
import { useUpdateUser, type UserChanges } from '../api/update-user';
import { ResetPasswordDialog } from './reset-password-dialog';

const SELF_HINT = 'Your own role and active flag can only be changed by another administrator.';

/** A role or active-flag change the admin asked for, waiting for their confirmation. */
type PendingChange =
  | { user: UserView; kind: 'role'; role: UserView['role'] }
  | { user: UserView; kind: 'active'; active: boolean };

function confirmText(change: PendingChange): { title: string; body: string; label: string; done: string } {
  const name = change.user.displayName;
  if (change.kind === 'role') {
    const from = ROLE_LABELS[change.user.role];
    const to = ROLE_LABELS[change.role];
    return {
      title: `Change ${name}'s role to ${to}?`,
      body: `${name} (${change.user.email}) is ${from} now. Their open sessions end; at the next sign-in they have the rights of ${to}.`,
      label: `Make ${to}`,
      done: `${name} is now ${to}; their sessions have ended.`,
    };
  }
  return change.active
    ? {
        title: `Reactivate ${name}?`,
        body: `${name} (${change.user.email}) can sign in again with their current password.`,
        label: 'Reactivate',
        done: `${name} can sign in again.`,
      }
    : {
        title: `Deactivate ${name}?`,
        body: `${name} (${change.user.email}) is signed out everywhere at once and cannot sign in until an admin reactivates the account. Their records stay.`,
        label: 'Deactivate',
        done: `${name} is deactivated and signed out.`,
      };
}

/** The request body that applies a change to the account as the admin saw it. */
function changesOf(change: PendingChange): UserChanges {
  const { version } = change.user;
  return change.kind === 'role' ? { role: change.role, version } : { active: change.active, version };
}

/**
 * The change that puts the account back as it was before `change`, based on the account as that
 * change left it: if another admin changed it since, the Undo is refused instead of overwriting.
 */
function reverseOf(change: PendingChange, saved: UserView): PendingChange {
  return change.kind === 'role'
    ? { user: saved, kind: 'role', role: change.user.role }
    : { user: saved, kind: 'active', active: !change.active };
}

interface UsersGridProps {
  /** The signed-in administrator: their own role and active flag are not editable here. */
  currentUserId: number;
}

/** Every account, with inline role change, activate/deactivate and password reset. */
export function UsersGrid({ currentUserId }: UsersGridProps) {
  const users = useUsers();
  const updateUser = useUpdateUser();
  const [resetFor, setResetFor] = useState<UserView | null>(null);
  const [pending, setPending] = useState<PendingChange | null>(null);
  const { mutate, mutateAsync } = updateUser;
  const pendingId = updateUser.isPending ? updateUser.variables.id : null;

  const columns = useMemo<GridColDef<UserView>[]>(
    () => [
      { field: 'email', headerName: 'E-mail', flex: 1.4, minWidth: 200 },
      { field: 'displayName', headerName: 'Name', flex: 1, minWidth: 150 },
      {
        field: 'role',
        headerName: 'Role',
        width: 170,
        renderCell: ({ row }) => (
          <NativeSelect
            value={row.role}
            disabled={row.id === currentUserId || row.id === pendingId}
            title={row.id === currentUserId ? SELF_HINT : undefined}
            onChange={(event) => {
              const role = event.target.value;
              if (isRole(role) && role !== row.role) setPending({ user: row, kind: 'role', role });
            }}
            inputProps={{ 'aria-label': `Role of ${row.email}` }}
            disableUnderline
          >
            {ROLES.map((role) => (
              <option key={role} value={role}>
                {ROLE_LABELS[role]}
              </option>
            ))}
          </NativeSelect>
        ),
      },
      {
        field: 'active',
        headerName: 'Active',
        width: 100,
        renderCell: ({ row }) => (
          <Switch
            checked={row.active}
            disabled={row.id === currentUserId || row.id === pendingId}
            onChange={(event) => setPending({ user: row, kind: 'active', active: event.target.checked })}
            slotProps={{
              input: {
                'aria-label': `Active: ${row.email}`,
                title: row.id === currentUserId ? SELF_HINT : undefined,
              },
            }}
          />
        ),
      },
      {
        field: 'createdAt',
        headerName: 'Created',
        width: 180,
        valueFormatter: (value: string) => formatDateTime(value),
      },
      {
        field: 'actions',
        headerName: 'Password',
        width: 160,
        sortable: false,
        filterable: false,
        renderCell: ({ row }) => (
          <Button size="small" onClick={() => setResetFor(row)} aria-label={`Reset password of ${row.email}`}>
            Reset password
          </Button>
        ),
      },
    ],
    [currentUserId, pendingId],
  );

  const confirm = () => {
    if (!pending) return;
    const change = pending;
    setPending(null);
    mutate(
      { id: change.user.id, changes: changesOf(change) },
      {
        onSuccess: (saved) =>
          notify(confirmText(change).done, 'success', {
            label: 'Undo',
            // The reverse goes through the same PATCH, so it is checked and audited like any change;
            // mutateAsync reports it even if the admin has left the page meanwhile.
            onAction: () => {
              const undo = reverseOf(change, saved);
              mutateAsync({ id: undo.user.id, changes: changesOf(undo) }).then(
                () => notify(confirmText(undo).done, 'success'),
                () => undefined, // the refusal is already on the snackbar
              );
            },
          }),
      },
    );
  };
  const text = pending ? confirmText(pending) : null;

  if (users.isError) return <ErrorAlert error={users.error} title="The user list could not be loaded" />;

  return (
    <>
      <DataGrid
        aria-label="Users"
        rows={users.data ?? []}
        columns={columns}
        loading={users.isPending}
        autoHeight
        disableRowSelectionOnClick
        initialState={{ sorting: { sortModel: [{ field: 'email', sort: 'asc' }] } }}
      />
      <ResetPasswordDialog user={resetFor} onClose={() => setResetFor(null)} />
      <ConfirmDialog
        open={pending !== null}
        title={text?.title ?? ''}
        confirmLabel={text?.label ?? ''}
        onConfirm={confirm}
        onCancel={() => setPending(null)}
      >
        {text?.body}
      </ConfirmDialog>
    </>
  );
}

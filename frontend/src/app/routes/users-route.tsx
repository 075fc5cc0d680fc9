import PersonAddOutlined from '@mui/icons-material/PersonAddOutlined';
import Button from '@mui/material/Button';
import { useState } from 'react';
import { PageHeader } from '../../components/page-header';
import { useSignedInUser } from '../../features/auth/signed-in-user';
import { ShopSettingsPanel } from '../../features/shop-settings/components/shop-settings-panel';
import { CreateUserDialog } from '../../features/users/components/create-user-dialog';
import { UsersGrid } from '../../features/users/components/users-grid';

export function UsersRoute() {
  const user = useSignedInUser();
  const [creating, setCreating] = useState(false);
  return (
    <>
      <PageHeader
        title="Users"
        description="Accounts of the shop: change a role, deactivate an account or set a new password."
        actions={
          <Button variant="contained" startIcon={<PersonAddOutlined />} onClick={() => setCreating(true)}>
            New user
          </Button>
        }
      />
      <ShopSettingsPanel />
      <UsersGrid currentUserId={user.id} />
      <CreateUserDialog open={creating} onClose={() => setCreating(false)} />
    </>
  );
}

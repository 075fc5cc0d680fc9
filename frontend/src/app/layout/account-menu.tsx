import AccountCircle from '@mui/icons-material/AccountCircle';
import Divider from '@mui/material/Divider';
import IconButton from '@mui/material/IconButton';
import ListItemText from '@mui/material/ListItemText';
import Menu from '@mui/material/Menu';
import MenuItem from '@mui/material/MenuItem';
import type { UserView } from '@quietglass/shared';
import { useId, useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { useSignOut } from '../../features/auth/api/sign-out';

/** The "Account" button of the top bar: own password and sign-out. */
export function AccountMenu({ user }: { user: UserView }) {
  const [anchor, setAnchor] = useState<HTMLElement | null>(null);
  const navigate = useNavigate();
  const signOut = useSignOut();
  const buttonId = useId();
  const menuId = useId();
  const close = () => setAnchor(null);

  return (
    <>
      <IconButton
        id={buttonId}
        color="inherit"
        aria-label="Account"
        aria-haspopup="menu"
        aria-controls={anchor ? menuId : undefined}
        aria-expanded={anchor ? 'true' : undefined}
        onClick={(event) => setAnchor(event.currentTarget)}
      >
        <AccountCircle />
      </IconButton>
      <Menu
        id={menuId}
        anchorEl={anchor}
        open={anchor !== null}
        onClose={close}
        anchorOrigin={{ vertical: 'bottom', horizontal: 'right' }}
        transformOrigin={{ vertical: 'top', horizontal: 'right' }}
        slotProps={{ list: { 'aria-labelledby': buttonId } }}
      >
        <ListItemText
          primary={user.displayName}
          secondary={user.email}
          sx={{ px: 2, py: 0.5 }}
          slotProps={{ secondary: { noWrap: true } }}
        />
        <Divider />
        <MenuItem
          onClick={() => {
            close();
            void navigate('/account');
          }}
        >
          Change password
        </MenuItem>
        <MenuItem
          disabled={signOut.isPending}
          onClick={() => {
            close();
            signOut.mutate();
          }}
        >
          Sign out
        </MenuItem>
      </Menu>
    </>
  );
}

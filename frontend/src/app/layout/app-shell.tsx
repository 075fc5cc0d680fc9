import AppBar from '@mui/material/AppBar';
import Box from '@mui/material/Box';
import Drawer from '@mui/material/Drawer';
import LinearProgress from '@mui/material/LinearProgress';
import List from '@mui/material/List';
import ListItemButton from '@mui/material/ListItemButton';
import ListItemIcon from '@mui/material/ListItemIcon';
import ListItemText from '@mui/material/ListItemText';
import Toolbar from '@mui/material/Toolbar';
import Typography from '@mui/material/Typography';
import type { SvgIconComponent } from '@mui/icons-material';
import { navSectionsFor } from '@quietglass/shared';
import { NavLink, Outlet, useNavigation } from 'react-router-dom';
import { useSignedInUser } from '../../features/auth/signed-in-user';
import { ROLE_LABELS } from '../../lib/roles';
import { AccountMenu } from './account-menu';
import { HOME_ICON, SECTION_ICONS } from './nav-icons';

const NAV_WIDTH = 240;

function NavItem({ to, label, Icon }: { to: string; label: string; Icon: SvgIconComponent }) {
  return (
    <ListItemButton
      component={NavLink}
      to={to}
      end={to === '/'}
      sx={{
        borderRadius: 1,
        mx: 1,
        '&.active': { bgcolor: 'action.selected', color: 'primary.dark', fontWeight: 600 },
        '&.active .MuiListItemIcon-root': { color: 'primary.main' },
      }}
    >
      <ListItemIcon sx={{ minWidth: 36 }}>
        <Icon fontSize="small" />
      </ListItemIcon>
      <ListItemText primary={label} />
    </ListItemButton>
  );
}

/** Top bar with the signed-in user and account menu, side navigation for the user's role, page area. */
export function AppShell() {
  const user = useSignedInUser();
  const sections = navSectionsFor(user.role);
  const navigation = useNavigation();

  return (
    <Box sx={{ display: 'flex', minHeight: '100vh' }}>
      <AppBar position="fixed" sx={{ zIndex: (theme) => theme.zIndex.drawer + 1 }}>
        <Toolbar>
          <Typography variant="h6" component="div" sx={{ flexGrow: 1, fontWeight: 600, letterSpacing: 0.3 }}>
            Quietglass
          </Typography>
          <Box sx={{ textAlign: 'right', mr: 1, lineHeight: 1.2 }}>
            <Typography variant="body2" component="div" sx={{ fontWeight: 500 }}>
              {user.displayName}
            </Typography>
            <Typography variant="caption" component="div" sx={{ opacity: 0.8 }}>
              {ROLE_LABELS[user.role]}
            </Typography>
          </Box>
          <AccountMenu user={user} />
        </Toolbar>
        {navigation.state === 'loading' && (
          <LinearProgress
            color="secondary"
            aria-label="Opening the page"
            sx={{ position: 'absolute', bottom: 0, left: 0, right: 0 }}
          />
        )}
      </AppBar>
      <Drawer
        variant="permanent"
        sx={{
          width: NAV_WIDTH,
          flexShrink: 0,
          '& .MuiDrawer-paper': { width: NAV_WIDTH, boxSizing: 'border-box' },
        }}
      >
        <Toolbar />
        <Box component="nav" aria-label="Main" sx={{ py: 1 }}>
          <List disablePadding>
            <NavItem to="/" label="Home" Icon={HOME_ICON} />
            {sections.map((section) => (
              <NavItem
                key={section.key}
                to={section.path}
                label={section.label}
                Icon={SECTION_ICONS[section.key]}
              />
            ))}
          </List>
        </Box>
      </Drawer>
      <Box component="main" sx={{ flexGrow: 1, p: 3, minWidth: 0 }}>
        <Toolbar />
        <Outlet />
      </Box>
    </Box>
  );
}

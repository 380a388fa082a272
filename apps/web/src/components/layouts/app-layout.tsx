import AppBar from '@mui/material/AppBar';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import Drawer from '@mui/material/Drawer';
import IconButton from '@mui/material/IconButton';
import SvgIcon from '@mui/material/SvgIcon';
import Toolbar from '@mui/material/Toolbar';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import { Outlet } from 'react-router-dom';
import { ROLE_LABELS } from '../../config/roles';
import { useSignOut, useUser } from '../../lib/auth';
import { useRouteFocus } from '../../lib/use-route-focus';
import { SideNav } from './side-nav';

const NAV_WIDTH = 232;

function MenuIcon() {
  return (
    <SvgIcon>
      <path d="M4 6h16v2H4zm0 5h16v2H4zm0 5h16v2H4z" />
    </SvgIcon>
  );
}

/** The frame around every signed-in page: app bar, side navigation and the page itself. */
export function AppLayout() {
  const user = useUser();
  const signOut = useSignOut();
  const [navOpen, setNavOpen] = useState(false);
  useRouteFocus('main-content');

  return (
    <Box sx={{ display: 'flex', minHeight: '100vh' }}>
      <Box
        component="a"
        href="#main-content"
        sx={{
          position: 'absolute',
          left: 8,
          top: -48,
          zIndex: (t) => t.zIndex.tooltip,
          bgcolor: 'background.paper',
          color: 'text.primary',
          px: 2,
          py: 1,
          borderRadius: 1,
          '&:focus': { top: 8 },
        }}
      >
        Skip to main content
      </Box>

      <AppBar position="fixed" sx={{ zIndex: (t) => t.zIndex.drawer + 1 }}>
        <Toolbar sx={{ gap: 1 }}>
          <IconButton
            color="inherit"
            edge="start"
            aria-label="Open navigation"
            aria-controls="side-navigation"
            aria-expanded={navOpen}
            onClick={() => setNavOpen(true)}
            sx={{ display: { md: 'none' } }}
          >
            <MenuIcon />
          </IconButton>
          <Typography
            component="p"
            variant="h6"
            sx={{ fontWeight: 700, flexGrow: 1, letterSpacing: '0.02em' }}
          >
            Kerfwright
          </Typography>
          <Box
            data-testid="signed-in-user"
            sx={{ display: 'flex', alignItems: 'center', gap: 1, minWidth: 0 }}
          >
            <Typography
              component="span"
              noWrap
              sx={{ display: { xs: 'none', sm: 'inline' }, maxWidth: 220 }}
              title={user.email}
            >
              {user.displayName}
            </Typography>
            <Chip
              label={ROLE_LABELS[user.role]}
              size="small"
              sx={{ bgcolor: '#f4eee3', color: '#1f2529', fontWeight: 500 }}
            />
          </Box>
          <Button color="inherit" variant="outlined" onClick={signOut} sx={{ ml: 1, whiteSpace: 'nowrap' }}>
            Sign out
          </Button>
        </Toolbar>
      </AppBar>

      <Box component="aside" sx={{ width: { md: NAV_WIDTH }, flexShrink: { md: 0 } }}>
        <Drawer
          id="side-navigation"
          variant="temporary"
          open={navOpen}
          onClose={() => setNavOpen(false)}
          sx={{ display: { xs: 'block', md: 'none' }, '& .MuiDrawer-paper': { width: NAV_WIDTH } }}
        >
          <Toolbar />
          <SideNav role={user.role} onNavigate={() => setNavOpen(false)} />
        </Drawer>
        <Drawer
          variant="permanent"
          open
          sx={{
            display: { xs: 'none', md: 'block' },
            '& .MuiDrawer-paper': {
              width: NAV_WIDTH,
              boxSizing: 'border-box',
              bgcolor: 'background.default',
            },
          }}
        >
          <Toolbar />
          <SideNav role={user.role} />
        </Drawer>
      </Box>

      <Box
        component="main"
        id="main-content"
        tabIndex={-1}
        sx={{ flexGrow: 1, minWidth: 0, p: { xs: 2, sm: 3 }, outline: 'none' }}
      >
        <Toolbar />
        <Outlet />
      </Box>
    </Box>
  );
}

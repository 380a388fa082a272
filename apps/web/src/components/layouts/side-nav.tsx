import { type Role } from '@kerfwright/contracts';
import List from '@mui/material/List';
import ListItemButton from '@mui/material/ListItemButton';
import ListItemText from '@mui/material/ListItemText';
import { NavLink } from 'react-router-dom';
import { navigationFor } from '../../config/navigation';

/** The pages this role may open. The current page is marked for eyes and for screen readers. */
export function SideNav({ role, onNavigate }: { role: Role; onNavigate?: () => void }) {
  return (
    <nav aria-label="Main">
      <List sx={{ px: 1 }}>
        {navigationFor(role).map((item) => (
          <ListItemButton
            key={item.href}
            component={NavLink}
            to={item.href}
            end={item.end}
            onClick={onNavigate}
            sx={{ mb: 0.5 }}
          >
            <ListItemText primary={item.label} />
          </ListItemButton>
        ))}
      </List>
    </nav>
  );
}

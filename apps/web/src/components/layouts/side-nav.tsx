import { type Role } from '@kerfwright/contracts';
import List from '@mui/material/List';
import ListItem from '@mui/material/ListItem';
import ListItemButton from '@mui/material/ListItemButton';
import ListItemText from '@mui/material/ListItemText';
import { NavLink } from 'react-router-dom';
import { navigationFor } from '../../config/navigation';

/**
 * The pages this role may open. The current page is marked for eyes and for screen readers. Each link sits in
 * a list item, so the list is read as one ("list, 6 items"; WCAG 2.1, 1.3.1).
 */
export function SideNav({ role, onNavigate }: { role: Role; onNavigate?: () => void }) {
  return (
    <nav aria-label="Main">
      <List sx={{ px: 1 }}>
        {navigationFor(role).map((item) => (
          <ListItem key={item.href} disablePadding sx={{ mb: 0.5 }}>
            <ListItemButton component={NavLink} to={item.href} end={item.end} onClick={onNavigate}>
              <ListItemText primary={item.label} />
            </ListItemButton>
          </ListItem>
        ))}
      </List>
    </nav>
  );
}

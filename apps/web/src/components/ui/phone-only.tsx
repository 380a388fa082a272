import Typography from '@mui/material/Typography';
import { type Theme } from '@mui/material/styles';
import useMediaQuery from '@mui/material/useMediaQuery';
import { type ReactNode } from 'react';

/**
 * A secondary line shown only at phone width, where the table column that says it is left out (see
 * DataTableColumn.hideOnPhone); not in the page otherwise, so nothing is said twice.
 */
export function PhoneOnly({ children }: { children: ReactNode }) {
  const phone = useMediaQuery((theme: Theme) => theme.breakpoints.down('sm'));
  return phone ? (
    <Typography component="span" color="text.secondary" sx={{ display: 'block', fontSize: '0.8125rem' }}>
      {children}
    </Typography>
  ) : null;
}

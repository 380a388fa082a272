import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Typography from '@mui/material/Typography';
import { type ReactNode } from 'react';
import { Link } from 'react-router-dom';

interface NotFoundPageProps {
  /** The heading, and the start of the tab's title: "No such job". */
  title: string;
  /** Why there is nothing to show, and where to look instead. */
  children: ReactNode;
  /** The way back: the list of what the reader can open, and its button's label. */
  backTo: string;
  backLabel: string;
  testId?: string;
}

/**
 * An address inside a section that names nothing the reader can open (mistyped, incomplete, or not theirs):
 * says so and offers the way back. No retry: asking again would get the same answer.
 */
export function NotFoundPage({ title, children, backTo, backLabel, testId }: NotFoundPageProps) {
  return (
    <Box sx={{ maxWidth: 640, mx: 'auto', my: 4, px: 2 }} data-testid={testId}>
      <title>{`${title} · Kerfwright`}</title>
      <Typography variant="h1" sx={{ mb: 1 }}>
        {title}
      </Typography>
      <Typography color="text.secondary" sx={{ mb: 2 }}>
        {children}
      </Typography>
      <Button variant="contained" component={Link} to={backTo}>
        {backLabel}
      </Button>
    </Box>
  );
}

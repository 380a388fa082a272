import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import { type ReactNode } from 'react';
import { ErrorPanel } from '../errors/error-panel';

interface ListPageProps {
  /** The heading, and the browser tab's title. */
  title: string;
  /** A button beside the heading (e.g. adding a record). */
  action?: ReactNode;
  /** What the list is, under the heading. */
  intro: ReactNode;
  /** A notice under the intro (e.g. a safety caution). */
  notice?: ReactNode;
  /** The list's filters, above the table. */
  filters?: ReactNode;
  /** The list's query: when it fails, an error panel with a retry stands in for the table. */
  query: { isError: boolean; error: unknown; refetch: () => unknown };
  errorTitle: string;
  maxWidth?: number;
  testId?: string;
  /** The list itself. */
  table: ReactNode;
  /** The page's dialogs and notices. */
  children?: ReactNode;
}

/** A page of one list: heading and intro, filters, then the table or what stopped it from loading. */
export function ListPage({
  title,
  action,
  intro,
  notice,
  filters,
  query,
  errorTitle,
  maxWidth = 1200,
  testId,
  table,
  children,
}: ListPageProps) {
  return (
    <Box sx={{ maxWidth }} data-testid={testId}>
      <title>{`${title} · Kerfwright`}</title>
      <Box sx={{ display: 'flex', alignItems: 'flex-start', gap: 2, flexWrap: 'wrap', mb: 1 }}>
        <Typography variant="h1" sx={{ flexGrow: 1 }}>
          {title}
        </Typography>
        {action}
      </Box>
      <Typography color="text.secondary" sx={{ mb: notice ? 2 : 3 }}>
        {intro}
      </Typography>
      {notice}
      {filters}
      {query.isError ? (
        <ErrorPanel title={errorTitle} error={query.error} onRetry={() => void query.refetch()} />
      ) : (
        table
      )}
      {children}
    </Box>
  );
}

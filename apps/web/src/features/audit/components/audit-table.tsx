import { type AuditEventView } from '@kerfwright/contracts';
import Link from '@mui/material/Link';
import Typography from '@mui/material/Typography';
import { type DataTableColumn } from '../../../components/data-table/data-table';
import { actionVerb, auditSummary, ENTITY_LABELS } from './audit-summary';
import { formatDateTime } from '../../../lib/dates';

interface AuditColumnsOptions {
  onActor: (actorId: string, name: string) => void;
  onEntity: (entityType: string, entityId: string) => void;
}

/** One row per recorded write: who, when, what action, on which record, and what it did. */
export function auditColumns({
  onActor,
  onEntity,
}: AuditColumnsOptions): DataTableColumn<AuditEventView, 'createdAt'>[] {
  return [
    {
      id: 'when',
      header: 'When',
      sortField: 'createdAt',
      // Kept on one line where there is room; on a phone it wraps, or it takes half the screen and leaves
      // "What happened" a word or two wide.
      cellSx: { whiteSpace: { xs: 'normal', sm: 'nowrap' } },
      render: (e) => formatDateTime(e.createdAt, { seconds: true }),
    },
    {
      id: 'who',
      header: 'Who',
      render: (e) =>
        e.actorId ? (
          <Link
            component="button"
            type="button"
            onClick={() => onActor(e.actorId!, e.actorName ?? 'this person')}
            title="Show only this person's actions"
          >
            {e.actorName ?? 'Removed account'}
          </Link>
        ) : (
          <Typography variant="body2" color="text.secondary">
            System
          </Typography>
        ),
    },
    {
      id: 'action',
      hideOnPhone: true,
      header: 'Action',
      // In words; the recorded action ("job.close") stays at hand for support, and for the action filter.
      render: (e) => {
        const verb = actionVerb(e.action);
        return <span title={e.action}>{`${verb.charAt(0).toUpperCase()}${verb.slice(1)}`}</span>;
      },
    },
    {
      id: 'record',
      hideOnTablet: true,
      header: 'Record',
      render: (e) => (
        <Link
          component="button"
          type="button"
          onClick={() => onEntity(e.entityType, e.entityId)}
          title="Show only this record's history"
        >
          {ENTITY_LABELS[e.entityType] ?? e.entityType}
        </Link>
      ),
    },
    { id: 'what', header: 'What happened', cellSx: { overflowWrap: 'anywhere' }, render: auditSummary },
  ];
}

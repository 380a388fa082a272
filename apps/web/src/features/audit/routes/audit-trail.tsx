import Box from '@mui/material/Box';
import Chip from '@mui/material/Chip';
import { useState } from 'react';
import { DataTable } from '../../../components/data-table/data-table';
import { FilterBar, SearchFilter, SelectFilter } from '../../../components/data-table/filter-bar';
import { ListPage } from '../../../components/layouts/list-page';
import { useAuditEvents } from '../api/get-audit-events';
import { ENTITY_LABELS } from '../components/audit-summary';
import { auditColumns } from '../components/audit-table';
import { useAuditSearchParams } from '../hooks/use-audit-search-params';

const ENTITY_TYPES = [
  'material',
  'machine-profile',
  'machine-profile-version',
  'kerf-record',
  'design',
  'job',
  'user',
  'safety',
] as const;

const ENTITY_OPTIONS = ENTITY_TYPES.map((value) => ({ value, label: ENTITY_LABELS[value] ?? value }));

/** Supervisors: every recorded write, newest first, narrowed by record type, action, person or record. */
export function AuditTrailRoute() {
  const { params, query, set, tableProps } = useAuditSearchParams();
  const events = useAuditEvents(query);
  // Names of filtered people, remembered from the row clicked (the address holds only ids).
  const [actorName, setActorName] = useState<string | null>(null);

  return (
    <ListPage
      title="Audit trail"
      maxWidth={1280}
      testId="audit-page"
      intro="Every change made in Kerfwright, who made it and when. Click a person or a record to see only theirs."
      filters={
        <>
          <FilterBar label="Filter the audit trail" columns="1fr 1fr">
            <SelectFilter
              id="audit-entity"
              label="Record type"
              allLabel="All records"
              value={params.entityType}
              options={ENTITY_OPTIONS}
              onChange={(entityType) => set({ entityType, entityId: undefined })}
            />
            <SearchFilter
              id="audit-action"
              label="Action starts with"
              placeholder="e.g. machine-profile-version."
              maxLength={80}
              value={params.action ?? ''}
              onSearch={(action) => set({ action })}
            />
          </FilterBar>
          <Box sx={{ display: 'flex', gap: 1, flexWrap: 'wrap', minHeight: 32, mb: 1 }}>
            {params.actor ? (
              <Chip
                label={`Person: ${actorName ?? params.actor}`}
                onDelete={() => set({ actor: undefined })}
              />
            ) : null}
            {params.entityId ? (
              <Chip
                label={`Only record ${params.entityId.slice(0, 8)}…`}
                onDelete={() => set({ entityId: undefined })}
              />
            ) : null}
          </Box>
        </>
      }
      query={events}
      errorTitle="The audit trail could not be loaded"
      table={
        <DataTable
          label="Audit trail"
          columns={auditColumns({
            onActor: (id, name) => {
              setActorName(name);
              set({ actor: id });
            },
            onEntity: (entityType, entityId) => set({ entityType, entityId }),
          })}
          rows={events.data?.items}
          rowKey={(e) => e.id}
          rowProps={(e) => ({ 'data-testid': 'audit-event', 'data-action': e.action })}
          loadingRows={5}
          minWidth={900}
          emptyText="No recorded action matches these filters."
          fetching={events.isFetching}
          fetchingLabel="Loading the audit trail"
          total={events.data?.total ?? 0}
          {...tableProps}
        />
      }
    />
  );
}

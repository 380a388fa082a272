import { MACHINE_PROFILE_KINDS, PROFILE_VERSION_STATES } from '@kerfwright/contracts';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import { useMemo, useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { DataTable } from '../../../components/data-table/data-table';
import { labelled, SearchSelectFilterBar } from '../../../components/data-table/filter-bar';
import { ListPage } from '../../../components/layouts/list-page';
import { paths } from '../../../config/paths';
import { UnitToggle } from '../../../components/ui/unit-toggle';
import { useLengthUnit } from '../../../lib/use-length-unit';
import { useCreateMachineProfile } from '../api/create-machine-profile';
import { useMachineProfiles } from '../api/get-machine-profiles';
import { useMaterialChoices } from '../api/get-material-choices';
import { ProfileFormDialog } from '../components/profile-form-dialog';
import { EMPTY_PROFILE, type ProfileFormValues, toVersionContent } from '../components/profile-form-schema';
import { KIND_LABELS, STATE_LABELS } from '../components/profile-labels';
import { profileColumns } from '../components/profiles-table';
import { useProfilesSearchParams } from '../hooks/use-profiles-search-params';

const SELECTS = {
  kind: {
    id: 'profiles-kind',
    label: 'Kind',
    allLabel: 'All kinds',
    options: labelled(MACHINE_PROFILE_KINDS, KIND_LABELS),
  },
  state: {
    id: 'profiles-state',
    label: 'Latest version',
    allLabel: 'Any state',
    options: labelled(PROFILE_VERSION_STATES, STATE_LABELS),
  },
};

/** Fabricators and supervisors: every machine profile, the version jobs use, and what waits for approval. */
export function MachineProfilesRoute() {
  const navigate = useNavigate();
  const { params, query, set, tableProps } = useProfilesSearchParams();
  const profiles = useMachineProfiles(query);
  const [creating, setCreating] = useState(false);
  const [unit, setUnit] = useLengthUnit();
  const columns = useMemo(() => profileColumns(unit), [unit]);
  const materials = useMaterialChoices(creating);
  const create = useCreateMachineProfile();
  const submit = (v: ProfileFormValues) => {
    create.mutate(
      { name: v.name.trim(), kind: v.kind, ...toVersionContent(v) },
      { onSuccess: (p) => void navigate(paths.machineProfile.getHref(p.id)) },
    );
  };

  return (
    <ListPage
      title="Machine profiles"
      testId="machine-profiles-page"
      action={
        <Box sx={{ display: 'flex', gap: 2, alignItems: 'center', flexWrap: 'wrap' }}>
          <UnitToggle unit={unit} onUnit={setUnit} />
          <Button
            variant="contained"
            onClick={() => {
              create.reset();
              setCreating(true);
            }}
          >
            New machine profile
          </Button>
        </Box>
      }
      intro="Each machine’s bed, speeds and cutting values per material, in numbered versions. Jobs use only an approved version; a new version is drafted, submitted and approved by a supervisor."
      filters={
        <SearchSelectFilterBar
          label="Find machine profiles"
          search={{ id: 'profiles-search', label: 'Search name' }}
          selects={SELECTS}
          values={{ q: params.q ?? '', kind: params.kind, state: params.state }}
          onChange={set}
        />
      }
      query={profiles}
      errorTitle="The machine profiles could not be loaded"
      table={
        <DataTable
          label="Machine profiles"
          columns={columns}
          rows={profiles.data?.items}
          rowKey={(p) => p.id}
          rowProps={(p) => ({ 'data-testid': `profile-${p.name}` })}
          loadingRows={3}
          minWidth={760}
          emptyText="No machine profile matches these filters."
          fetching={profiles.isFetching}
          fetchingLabel="Loading machine profiles"
          total={profiles.data?.total ?? 0}
          {...tableProps}
        />
      }
    >
      <ProfileFormDialog
        open={creating}
        mode="create"
        unit={unit}
        initial={EMPTY_PROFILE}
        materials={materials.data?.items}
        materialsError={materials.error}
        busy={create.isPending}
        error={create.error}
        onSubmit={submit}
        onClose={() => setCreating(false)}
      />
    </ListPage>
  );
}

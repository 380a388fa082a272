import { type MaterialView } from '@kerfwright/contracts';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import { useState } from 'react';
import { DataTable } from '../../../components/data-table/data-table';
import { ListPage } from '../../../components/layouts/list-page';
import { useCreateMaterial } from '../api/create-material';
import { useHazardTable } from '../api/get-hazard-table';
import { useMaterials } from '../api/get-materials';
import { useUpdateMaterial } from '../api/update-material';
import { MaterialFormDialog } from '../components/material-form-dialog';
import { type MaterialFormValues, toMaterialRequest } from '../components/material-form-schema';
import { MaterialsFilters } from '../components/materials-filters';
import { materialColumns, materialRowSx } from '../components/materials-table';
import { useMaterialsSearchParams } from '../hooks/use-materials-search-params';
import { useUser } from '../../../lib/auth';
import { NoticeSnackbar } from '../../../components/ui/notice-snackbar';
import { UnitToggle } from '../../../components/ui/unit-toggle';
import { useLengthUnit } from '../../../lib/use-length-unit';

/** Fabricators and supervisors: the workshop's materials, their stock and whether they may go on a laser. */
export function MaterialsRoute() {
  const user = useUser();
  const { params, query, set, tableProps } = useMaterialsSearchParams();
  const materials = useMaterials(query);
  const hazards = useHazardTable();
  const create = useCreateMaterial();
  const change = useUpdateMaterial();
  // undefined: closed; null: adding; a material: changing it.
  const [editing, setEditing] = useState<MaterialView | null | undefined>(undefined);
  const [notice, setNotice] = useState<string | null>(null);
  // Thicknesses and sheet sizes in the unit this browser shows lengths in, as on every other page.
  const [unit, setUnit] = useLengthUnit();

  const mutation = editing ? change : create;

  const open = (material: MaterialView | null) => {
    create.reset();
    change.reset();
    setEditing(material);
  };

  const submit = (values: MaterialFormValues) => {
    const body = toMaterialRequest(values);
    if (editing) {
      change.mutate(
        { id: editing.id, changes: { ...body, version: editing.version } },
        {
          onSuccess: (saved) => {
            setNotice(`${saved.name} is saved.`);
            setEditing(undefined);
          },
        },
      );
    } else {
      create.mutate(body, {
        onSuccess: (saved) => {
          setNotice(`${saved.name} is in the library.`);
          setEditing(undefined);
        },
      });
    }
  };

  return (
    <ListPage
      title="Materials"
      maxWidth={1280}
      testId="materials-page"
      action={
        <Box sx={{ display: 'flex', gap: 2, alignItems: 'center', flexWrap: 'wrap' }}>
          <UnitToggle unit={unit} onUnit={setUnit} />
          <Button variant="contained" onClick={() => open(null)}>
            Add a material
          </Button>
        </Box>
      }
      intro="The sheet stock the workshop cuts: thickness, colours, sheet sizes and prices. A material kept off the laser is marked in red with its reason, and cannot be prepared for a laser job."
      notice={
        <Alert severity="info" sx={{ mb: 2 }}>
          Laser rules come from the workshop’s hazard table. They do not replace local codes, the machine
          maker’s manual or the workshop’s own rules; when a material cannot be identified, keep it off the
          laser.
        </Alert>
      }
      filters={
        <MaterialsFilters q={params.q ?? ''} family={params.family} laser={params.laser} onChange={set} />
      }
      query={materials}
      errorTitle="The materials could not be loaded"
      table={
        <DataTable
          label="Materials"
          columns={materialColumns(unit, open)}
          rows={materials.data?.items}
          rowKey={(m) => m.id}
          rowProps={(m) => ({ 'data-testid': `material-${m.name}` })}
          rowSx={materialRowSx}
          loadingRows={Math.min(params.pageSize, 5)}
          minWidth={900}
          emptyText="No material matches these filters."
          fetching={materials.isFetching}
          fetchingLabel="Loading materials"
          total={materials.data?.total ?? 0}
          {...tableProps}
        />
      }
    >
      <MaterialFormDialog
        open={editing !== undefined}
        material={editing ?? null}
        unit={unit}
        hazards={hazards.data}
        canLiftLaserRestriction={user.role === 'supervisor'}
        busy={mutation.isPending}
        error={mutation.error}
        onSubmit={submit}
        onClose={() => setEditing(undefined)}
      />
      <NoticeSnackbar notice={notice} onClose={() => setNotice(null)} />
    </ListPage>
  );
}

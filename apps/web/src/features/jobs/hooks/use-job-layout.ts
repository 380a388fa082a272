import { type DesignSpecInput, type JobView } from '@kerfwright/contracts';
import { useDesign } from '../../designs/api/get-design';
import { useLayoutTask } from '../../layout/hooks/use-layout-task';
import { useMachineProfiles } from '../api/get-machine-profiles';
import { useMaterials } from '../api/get-materials';

/** The job's sheets, laid out in the browser once the design and the material are loaded. */
export function useJobLayout(job: JobView, enabled: boolean) {
  const design = useDesign(enabled && job.preparation ? job.designId : undefined);
  const materials = useMaterials(enabled && Boolean(job.preparation));
  const profiles = useMachineProfiles(enabled && Boolean(job.preparation));
  const material = materials.data?.items.find((m) => m.id === job.materialId);
  // Machine profiles are for staff; without them the sheets are drawn all the same, without time and cost.
  const profilesSettled = profiles.isSuccess || profiles.isError;
  const ready = enabled && job.preparation && design.data && materials.data && profilesSettled;
  const key = ready
    ? JSON.stringify([job.id, job.version, design.data?.version, material?.version, profiles.dataUpdatedAt])
    : null;
  const result = useLayoutTask(key, 'job', () => [
    job,
    design.data?.spec as DesignSpecInput,
    material,
    profiles.data?.items ?? [],
  ]);
  return {
    ...result,
    loading: result.pending || design.isLoading || materials.isLoading || profiles.isLoading,
    error: result.error ?? design.error ?? materials.error,
  };
}

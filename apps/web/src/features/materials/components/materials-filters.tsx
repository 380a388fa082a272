import { MATERIAL_FAMILIES, type MaterialFamily } from '@kerfwright/contracts';
import { labelled, SearchSelectFilterBar } from '../../../components/data-table/filter-bar';
import { type LaserFilter } from '../hooks/use-materials-search-params';
import { FAMILY_LABELS } from './material-labels';

interface MaterialsFiltersProps {
  q: string;
  family: MaterialFamily | undefined;
  laser: LaserFilter | undefined;
  onChange: (change: { q?: string; family?: MaterialFamily; laser?: LaserFilter }) => void;
}

const SELECTS = {
  family: {
    id: 'materials-family',
    label: 'Family',
    allLabel: 'All families',
    options: labelled(MATERIAL_FAMILIES, FAMILY_LABELS),
  },
  laser: {
    id: 'materials-laser',
    label: 'Laser',
    allLabel: 'Any',
    options: [
      { value: 'allowed', label: 'Laser-allowed' },
      { value: 'refused', label: 'Kept off the laser' },
    ],
  },
} as const;

/** Search by name or notes, and narrow by family and by whether the material may go on a laser. */
export function MaterialsFilters({ onChange, ...values }: MaterialsFiltersProps) {
  return (
    <SearchSelectFilterBar
      label="Find materials"
      search={{ id: 'materials-search', label: 'Search name or notes' }}
      selects={SELECTS}
      values={values}
      onChange={onChange}
    />
  );
}

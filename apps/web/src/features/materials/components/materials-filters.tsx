import { MATERIAL_FAMILIES, type MaterialFamily } from '@kerfwright/contracts';
import { FilterBar, labelled, SearchFilter, SelectFilter } from '../../../components/data-table/filter-bar';
import { type LaserFilter } from '../hooks/use-materials-search-params';
import { FAMILY_LABELS } from './material-labels';

interface MaterialsFiltersProps {
  q: string;
  family: MaterialFamily | undefined;
  laser: LaserFilter | undefined;
  onChange: (change: { q?: string; family?: MaterialFamily; laser?: LaserFilter }) => void;
}

const FAMILY_OPTIONS = labelled(MATERIAL_FAMILIES, FAMILY_LABELS);
const LASER_OPTIONS = [
  { value: 'allowed', label: 'Laser-allowed' },
  { value: 'refused', label: 'Kept off the laser' },
] as const;

/** Search by name or notes, and narrow by family and by whether the material may go on a laser. */
export function MaterialsFilters({ q, family, laser, onChange }: MaterialsFiltersProps) {
  return (
    <FilterBar label="Find materials" columns="2fr 1fr 1fr">
      <SearchFilter
        id="materials-search"
        label="Search name or notes"
        value={q}
        onSearch={(text) => onChange({ q: text })}
      />
      <SelectFilter
        id="materials-family"
        label="Family"
        allLabel="All families"
        value={family}
        options={FAMILY_OPTIONS}
        onChange={(value) => onChange({ family: value })}
      />
      <SelectFilter
        id="materials-laser"
        label="Laser"
        allLabel="Any"
        value={laser}
        options={LASER_OPTIONS}
        onChange={(value) => onChange({ laser: value })}
      />
    </FilterBar>
  );
}

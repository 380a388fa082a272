import { describe, expect, it } from 'vitest';
import { auditSummary, changedFields } from './audit-summary';

describe('audit summaries', () => {
  it('names the record and what happened to it', () => {
    expect(
      auditSummary({
        action: 'material.create',
        entityType: 'material',
        before: null,
        after: { name: 'Birch plywood 3 mm', version: 1 },
      }),
    ).toBe('Material “Birch plywood 3 mm” created');
  });

  it('gives a version sent back its state change and reason', () => {
    expect(
      auditSummary({
        action: 'machine-profile-version.return',
        entityType: 'machine-profile-version',
        before: { number: 2, state: 'submitted', returnReason: null, lockVersion: 2 },
        after: { number: 2, state: 'draft', returnReason: 'Measure two more coupons', lockVersion: 3 },
      }),
    ).toBe('Profile version 2 sent back (submitted → draft; reason: Measure two more coupons)');
  });

  it('gives a machine taken out of use its reason, and a version replaced by a newer approval none', () => {
    const before = { number: 3, state: 'approved', profileName: 'Bay 3 laser', retireReason: null };
    expect(
      auditSummary({
        action: 'machine-profile-version.retire',
        entityType: 'machine-profile-version',
        before,
        after: { ...before, state: 'retired', retireReason: 'Laser tube cracked' },
      }),
    ).toMatch(/\(approved → retired; reason: Laser tube cracked\)$/);
    expect(
      auditSummary({
        action: 'machine-profile-version.retire',
        entityType: 'machine-profile-version',
        before,
        after: { ...before, state: 'retired' },
      }),
    ).toMatch(/\(approved → retired\)$/);
  });

  it('names a version by its profile when the entry carries the profile name', () => {
    expect(
      auditSummary({
        action: 'machine-profile-version.submit',
        entityType: 'machine-profile-version',
        before: { number: 2, state: 'draft', profileName: 'Bay 3 laser' },
        after: { number: 2, state: 'submitted', profileName: 'Bay 3 laser' },
      }),
    ).toBe('Profile “Bay 3 laser” version 2 submitted for approval (draft → submitted)');
  });

  it('names the job by its design when the entry carries it', () => {
    expect(
      auditSummary({
        action: 'job.approve',
        entityType: 'job',
        before: { state: 'prepared', designName: 'Octahedron hexagons' },
        after: { state: 'approved', designName: 'Octahedron hexagons' },
      }),
    ).toBe('Job “Octahedron hexagons” approved (prepared → approved)');
  });

  it('never shows a record id: an adoption says what happened, an id field only that it changed', () => {
    const record = {
      id: '0b7d1c9e-5f7a-4c1e-9d3f-2a6b8c4e1f00',
      profileId: '5e2f8a10-3c4b-4d6e-8f9a-0b1c2d3e4f50',
      materialId: '7a1b2c3d-4e5f-4a6b-8c7d-9e0f1a2b3c40',
      materialName: '',
      kerfMm: 0.18,
      adoptedVersionId: null,
    };
    const adopted = { ...record, adoptedVersionId: 'c80d26af-1234-4abc-9def-0123456789ab' };
    const line = auditSummary({
      action: 'kerf-record.adopt',
      entityType: 'kerf-record',
      before: record,
      after: adopted,
    });
    expect(line).toBe('Kerf record adopted into a draft (0.18 mm)');
    // Written as every page writes a kerf: two decimals at least.
    const tenth = auditSummary({
      action: 'kerf-record.adopt',
      entityType: 'kerf-record',
      before: { ...record, kerfMm: 0.2 },
      after: { ...adopted, kerfMm: 0.2 },
    });
    expect(tenth).toBe('Kerf record adopted into a draft (0.20 mm)');
    expect(line).not.toMatch(/c80d26af|adopted version id/);

    const updated = auditSummary({
      action: 'material.update',
      entityType: 'material',
      before: { name: 'Felt', ownerId: null, sourceRef: 'c80d26af-1234-4abc-9def-0123456789ab' },
      after: {
        name: 'Felt',
        ownerId: '0b7d1c9e-5f7a-4c1e-9d3f-2a6b8c4e1f00',
        sourceRef: '7a1b2c3d-4e5f-4a6b-8c7d-9e0f1a2b3c40',
      },
    });
    expect(updated).toBe('Material “Felt” changed (changed owner set, source ref changed)');
  });

  it('lists the fields an update changed, leaving out bookkeeping fields', () => {
    const before = { name: 'Felt', colours: ['grey'], version: 1, updatedAt: 'a' };
    const after = { name: 'Felt', colours: ['grey', 'moss'], version: 2, updatedAt: 'b' };
    expect(changedFields(before, after)).toEqual(['colours']);
    expect(auditSummary({ action: 'material.update', entityType: 'material', before, after })).toBe(
      'Material “Felt” changed (changed colours)',
    );
    // Short values are shown before and after, and field names read as words.
    expect(
      auditSummary({
        action: 'material.update',
        entityType: 'material',
        before: { name: 'Grey board', family: 'pvc', laserAllowed: false, nominalThicknessMm: 3 },
        after: { name: 'Grey board', family: 'acrylic', laserAllowed: true, nominalThicknessMm: 3.2 },
      }),
    ).toBe(
      'Material “Grey board” changed (changed family: “pvc” → “acrylic”, laser allowed: no → yes, nominal thickness (mm): 3 → 3.2)',
    );
  });

  it('tells a cut pack queued and built apart from the job being requested', () => {
    expect(
      auditSummary({ action: 'export.request', entityType: 'job', before: null, after: { exportId: 'e-1' } }),
    ).toBe('Job cut pack queued');
    expect(
      auditSummary({
        action: 'export.done',
        entityType: 'job',
        before: null,
        after: { exportId: 'e-1', files: [{ name: 'setup-sheet.pdf' }, { name: 'manifest.json' }] },
      }),
    ).toBe('Job cut pack built (2 files)');
    expect(auditSummary({ action: 'job.request', entityType: 'job', before: null, after: null })).toBe(
      'Job requested',
    );
    expect(auditSummary({ action: 'job.return', entityType: 'job', before: null, after: null })).toBe(
      'Job returned',
    );
  });
});

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
    ).toBe('Profile version “version 2” sent back (submitted → draft; reason: Measure two more coupons)');
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

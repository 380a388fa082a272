/**
 * The `nest` command of the geometry CLI, without file I/O: validates parsed JSON of the form
 * { "sheet": {"widthMm","heightMm"}, "marginMm", "gapMm", "parts": [{"id","outline":[[x,y]…],"quantity",
 * "group"?, "rotationsDeg"?, "envelope"?}], "rotationsDeg"? } and returns the object to print. Invalid input and parts that
 * cannot fit come back as { "error": { "code", "message", "partIds" } } (the caller decides the exit code).
 */
import { nestParts, type NestInput, type NestPartInput, type NestTotals } from './nest';

export interface NestOutput {
  sheets?: {
    group: string;
    placements: { part: string; x: number; y: number; rotationDeg: number }[];
    utilisation: number;
    usedLengthMm: number;
  }[];
  totals?: NestTotals;
  error?: { code: string; message: string; partIds: string[] };
}

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

function finite(v: unknown): v is number {
  return typeof v === 'number' && Number.isFinite(v);
}

function rotations(v: unknown, where: string, problems: string[]): readonly number[] | 'auto' | undefined {
  if (v === undefined || v === 'auto') return v;
  if (Array.isArray(v) && v.length > 0 && v.every(finite)) return v;
  problems.push(`${where}.rotationsDeg must be "auto" or a non-empty list of numbers`);
  return undefined;
}

function pointList(v: unknown): boolean {
  return (
    Array.isArray(v) &&
    v.length >= 3 &&
    v.every((pt: unknown) => Array.isArray(pt) && pt.length === 2 && finite(pt[0]) && finite(pt[1]))
  );
}

/** Names a key not in `allowed` (a typo such as "gapMM" would otherwise be silently left at its default). */
function unknownKeys(
  v: Record<string, unknown>,
  allowed: readonly string[],
  where: string,
  problems: string[],
) {
  for (const k of Object.keys(v))
    if (!allowed.includes(k)) {
      const near = allowed.find((a) => a.toLowerCase() === k.toLowerCase());
      problems.push(`${where}${k} is not a known field${near ? ` (did you mean ${where}${near}?)` : ''}`);
    }
}

/** Validates the command's input and nests it. Never throws for bad input. */
export function runNestCommand(input: unknown): NestOutput {
  const problems: string[] = [];
  const invalid = (): NestOutput => ({
    error: { code: 'INVALID_INPUT', message: problems.join('; '), partIds: [] },
  });
  if (!isRecord(input)) {
    problems.push('input must be a JSON object');
    return invalid();
  }
  unknownKeys(input, ['sheet', 'marginMm', 'gapMm', 'parts', 'rotationsDeg'], '', problems);
  const sheet = input.sheet;
  if (isRecord(sheet)) unknownKeys(sheet, ['widthMm', 'heightMm'], 'sheet.', problems);
  if (!isRecord(sheet)) problems.push('sheet must be {"widthMm": > 0, "heightMm": > 0}');
  else {
    for (const key of ['widthMm', 'heightMm'] as const) {
      const v = sheet[key];
      if (finite(v) && v > 0) continue;
      // Said per side, and a number written as text is named as such (a common slip in hand-written JSON).
      const got = typeof v === 'string' ? ` (got the text "${v}": write the number without quotes)` : '';
      problems.push(`sheet.${key} must be a finite number > 0, in millimetres${got}`);
    }
  }
  // Absent means the default; null is not a number.
  const marginMm = input.marginMm === undefined ? 0 : input.marginMm;
  const gapMm = input.gapMm === undefined ? 0 : input.gapMm;
  if (!finite(marginMm) || marginMm < 0) problems.push('marginMm must be a number ≥ 0');
  if (!finite(gapMm) || gapMm < 0) problems.push('gapMm must be a number ≥ 0');
  const runRotations = rotations(input.rotationsDeg, 'input', problems);
  const parts: NestPartInput[] = [];
  if (!Array.isArray(input.parts) || input.parts.length === 0)
    problems.push('parts must be a non-empty list');
  else
    input.parts.forEach((p: unknown, i: number) => {
      const where = `parts[${i}]`;
      if (!isRecord(p)) {
        problems.push(`${where} must be an object`);
        return;
      }
      unknownKeys(
        p,
        ['id', 'outline', 'quantity', 'group', 'rotationsDeg', 'envelope'],
        `${where}.`,
        problems,
      );
      if (typeof p.id !== 'string' || p.id.length === 0)
        problems.push(`${where}.id must be a non-empty string`);
      const q = p.quantity === undefined ? 1 : p.quantity;
      if (!finite(q) || !Number.isInteger(q) || q < 0)
        problems.push(`${where}.quantity must be a whole number ≥ 0`);
      const outline = p.outline;
      const okOutline = pointList(outline);
      if (!okOutline) problems.push(`${where}.outline must be a list of at least 3 [x, y] number pairs`);
      if (p.group !== undefined && typeof p.group !== 'string')
        problems.push(`${where}.group must be a string`);
      const rot = rotations(p.rotationsDeg, where, problems);
      const envelope = p.envelope;
      const okEnvelope = envelope === undefined || pointList(envelope);
      if (!okEnvelope) problems.push(`${where}.envelope must be a list of at least 3 [x, y] number pairs`);
      if (typeof p.id === 'string' && okOutline && finite(q))
        parts.push({
          id: p.id,
          outline: outline as [number, number][],
          quantity: q,
          ...(typeof p.group === 'string' ? { group: p.group } : {}),
          ...(rot !== undefined ? { rotationsDeg: rot } : {}),
          ...(envelope !== undefined && okEnvelope ? { envelope: envelope as [number, number][] } : {}),
        });
    });
  if (problems.length > 0) return invalid();
  const nestInput: NestInput = {
    sheet: {
      widthMm: (sheet as { widthMm: number }).widthMm,
      heightMm: (sheet as { heightMm: number }).heightMm,
    },
    marginMm: marginMm as number,
    gapMm: gapMm as number,
    parts,
    ...(runRotations !== undefined ? { rotationsDeg: runRotations } : {}),
  };
  const result = nestParts(nestInput);
  if (!result.ok) return { error: result.error };
  return {
    sheets: result.sheets.map((s) => ({
      group: s.group,
      placements: s.placements,
      utilisation: s.utilisation,
      usedLengthMm: s.usedLengthMm,
    })),
    totals: result.totals,
  };
}

import { plainToInstance } from 'class-transformer';
import { validateSync } from 'class-validator';
import { ScaleDto, toScaleSpec } from './job.dto';

/** The scale shapes of the geometry CLI's spec (libs/geometry README): fixed, fitSheets, fitBed. */
function errorsOf(plain: object): string[] {
  const dto = plainToInstance(ScaleDto, plain);
  return validateSync(dto, { whitelist: true, forbidNonWhitelisted: true }).flatMap((e) =>
    Object.values(e.constraints ?? {}),
  );
}

describe('ScaleDto', () => {
  it.each([
    [{ by: 'diameter', mm: 240 }],
    [{ by: 'planeDistance', mm: 80 }],
    [{ by: 'pieceCircumradius', mm: 60 }],
    [{ by: 'fitSheets', sheets: 3 }],
    [{ by: 'fitBed' }],
  ])('accepts %j', (plain) => {
    expect(errorsOf(plain)).toEqual([]);
    expect(toScaleSpec(plainToInstance(ScaleDto, plain))).toEqual(plain);
  });

  it.each([
    [{ by: 'diameter' }, /takes mm/],
    [{ by: 'diameter', mm: 240, sheets: 2 }, /takes mm and no sheets/],
    [{ by: 'fitSheets' }, /takes sheets/],
    [{ by: 'fitSheets', sheets: 2, mm: 100 }, /takes sheets and no mm/],
    [{ by: 'fitBed', mm: 100 }, /neither/],
    [{ by: 'fitSheets', sheets: 0 }, /sheets must not be less than 1/],
    [{ by: 'fitSheets', sheets: 1.5 }, /sheets must be an integer/],
    [{ by: 'fitEverything' }, /by must be one of/],
  ])('refuses %j', (plain, message) => {
    expect(errorsOf(plain).join('; ')).toMatch(message);
  });
});

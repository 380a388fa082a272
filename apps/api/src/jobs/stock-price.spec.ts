import { pricedSheet, stockSheetOf } from '@kerfwright/contracts';
import { sheetFitsBed } from './job-preparation.service';

const material = {
  stockSheets: [
    { widthMm: 600, heightMm: 400, pricePerSheet: 18, currency: 'EUR' },
    { widthMm: 1220, heightMm: 2440, pricePerSheet: 61.5, currency: 'GBP' },
  ],
};

describe('the stock sheet a job is priced by', () => {
  it('finds the listed size either way round, and nothing for a size typed in', () => {
    expect(stockSheetOf(material, { widthMm: 600, heightMm: 400 })?.pricePerSheet).toBe(18);
    expect(stockSheetOf(material, { widthMm: 400, heightMm: 600 })?.pricePerSheet).toBe(18);
    expect(stockSheetOf(material, { widthMm: 600, heightMm: 1000 })).toBeUndefined();
  });

  it('prices a sheet only in the machine’s currency, so machine and material costs can be added up', () => {
    expect(pricedSheet(material, { widthMm: 600, heightMm: 400 }, 'EUR')).toBe(18);
    expect(pricedSheet(material, { widthMm: 1220, heightMm: 2440 }, 'EUR')).toBeNull();
    expect(pricedSheet(material, { widthMm: 2440, heightMm: 1220 }, 'GBP')).toBe(61.5);
    expect(pricedSheet(material, { widthMm: 600, heightMm: 1000 }, 'EUR')).toBeNull();
  });

  it('takes a sheet on the bed either way round', () => {
    const bed = { widthMm: 1000, heightMm: 600 };
    expect(sheetFitsBed({ widthMm: 600, heightMm: 1000 }, bed)).toBe(true);
    expect(sheetFitsBed({ widthMm: 700, heightMm: 700 }, bed)).toBe(false);
  });
});

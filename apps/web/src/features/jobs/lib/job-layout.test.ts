import { type MachineProfileSummaryView, type MaterialView } from '@kerfwright/contracts';
import { describe, expect, it } from 'vitest';
import { jobFixture, preparationFixture, versionFixture } from '../../../testing/fixtures';
import { type SheetView } from '../../layout/lib/sheet-views';
import { jobEstimate } from './job-layout';

// One 600 × 400 mm sheet holding a 100 mm square: the cut and time do not matter here, only the sheet's price.
const sheets: SheetView[] = [
  {
    widthMm: 600,
    heightMm: 400,
    marginMm: 5,
    colourIndex: 0,
    colourName: null,
    utilisation: 10000 / 240000,
    pieces: [
      {
        id: 'A1',
        colourIndex: 0,
        outline: [
          [10, 10],
          [110, 10],
          [110, 110],
          [10, 110],
        ],
      },
    ],
  },
];
const profiles = [
  { id: 'p-1', currentApproved: versionFixture(), latest: versionFixture() },
] as unknown as MachineProfileSummaryView[];
const acrylic = (stockSheets: MaterialView['stockSheets']) =>
  ({ id: 'm-acrylic', stockSheets }) as MaterialView;
const job = (pricePerSheet?: number | null) =>
  jobFixture({
    state: 'prepared',
    profileVersionId: 'v-1',
    materialId: 'm-acrylic',
    preparation: preparationFixture({
      sheet: { widthMm: 600, heightMm: 400 },
      ...(pricePerSheet !== undefined ? { pricePerSheet } : {}),
    }),
  });

describe("a job's estimate on its page", () => {
  it('prices the sheet as preparation does: a listed size either way round, in the machine’s currency', () => {
    // The API's pricedSheet (job preparation) is the reference: 400 × 600 is the 600 × 400 sheet turned.
    const turned = acrylic([{ widthMm: 400, heightMm: 600, pricePerSheet: 18, currency: 'EUR' }]);
    expect(jobEstimate(sheets, job(), turned, profiles)?.materialCost).toBe(18);
    // Priced in another currency than the machine's: not added up, so unknown rather than a wrong sum.
    const pounds = acrylic([{ widthMm: 600, heightMm: 400, pricePerSheet: 15, currency: 'GBP' }]);
    expect(jobEstimate(sheets, job(), pounds, profiles)?.materialCost).toBeNull();
  });

  it('takes the price kept at preparation, which the cut pack prints, over today’s list', () => {
    const dearer = acrylic([{ widthMm: 600, heightMm: 400, pricePerSheet: 36, currency: 'EUR' }]);
    expect(jobEstimate(sheets, job(18), dearer, profiles)?.materialCost).toBe(18);
    expect(jobEstimate(sheets, job(null), dearer, profiles)?.materialCost).toBeNull();
  });

  it("works a router job's cut along the bit centre's path: 2πr longer round the square", () => {
    // Steiner's formula: the boundary of a convex set grown by r is P + 2πr long (the bit's centre runs half
    // a diameter outside the outline). Arcs are drawn as chords within 0.002 mm.
    const laser = jobEstimate(sheets, job(), undefined, profiles);
    const routerJob = jobFixture({
      ...job(),
      preparation: preparationFixture({ machineKind: 'router', toolDiameterMm: 6, kerfMm: undefined }),
    });
    const router = jobEstimate(sheets, routerJob, undefined, profiles);
    expect(laser?.cutLengthMm).toBeCloseTo(400, 6);
    expect(router?.cutLengthMm).toBeCloseTo(400 + 6 * Math.PI, 1);
  });
});

import type { DesignIssue, DesignSpec, DesignSpecInput } from './spec';

/** The engine's figures kept with a design so lists show them without rebuilding. */
export interface DesignPreview {
  valid: boolean;
  pieceCount: number;
  crossingCount: number;
  diameterMm: number;
  planeDistanceMm: number;
  errors: DesignIssue[];
  warnings: DesignIssue[];
}

export interface DesignView {
  id: string;
  ownerId: string;
  ownerName: string;
  name: string;
  description: string;
  spec: DesignSpec;
  /** Original file name when the base solid was uploaded. */
  solidFileName: string | null;
  preview: DesignPreview;
  version: number;
  createdAt: string;
  updatedAt: string;
}

/** List rows leave out the spec's uploaded solid text, which can be large. */
export type DesignSummary = Omit<DesignView, 'spec'> & { solid: string };

/** A design's spec may size the model by a fit to the stock (`fitSheets`, `fitBed`), as in the CLI. */
export interface CreateDesignRequest {
  name: string;
  description?: string;
  spec: DesignSpecInput;
}

export interface UpdateDesignRequest {
  name?: string;
  description?: string;
  spec?: DesignSpecInput;
  /** The version the client read; a stale one gets 409. */
  version: number;
}

/** Limits on an uploaded OBJ/OFF solid. */
export const SOLID_UPLOAD_MAX_BYTES = 2 * 1024 * 1024;

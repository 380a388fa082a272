import * as path from 'node:path';

export interface ContentPaths {
  noticesDir: string;
  hazardsFile: string;
  samplesDir: string;
}

/** Where the content files live, relative to the repository root. */
export function contentPaths(repoRoot: string): ContentPaths {
  return {
    noticesDir: path.join(repoRoot, 'safety', 'notices'),
    hazardsFile: path.join(repoRoot, 'safety', 'material-hazards.json'),
    samplesDir: path.join(repoRoot, 'samples'),
  };
}

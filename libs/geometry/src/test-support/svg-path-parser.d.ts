declare module 'svg-path-parser' {
  export interface PathCommand {
    code: string;
    command: string;
    x?: number;
    y?: number;
    relative?: boolean;
  }
  export function parseSVG(d: string): PathCommand[];
  export function makeAbsolute(commands: PathCommand[]): (PathCommand & { x0: number; y0: number })[];
}

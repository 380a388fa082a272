declare module 'obj-file-parser' {
  interface ObjVertex {
    x: number;
    y: number;
    z: number;
  }
  interface ObjFace {
    vertices: { vertexIndex: number }[];
  }
  interface ObjModel {
    name: string;
    vertices: ObjVertex[];
    faces: ObjFace[];
  }
  export default class OBJFile {
    constructor(text: string, defaultModelName?: string);
    parse(): { models: ObjModel[]; materialLibraries: string[] };
  }
}

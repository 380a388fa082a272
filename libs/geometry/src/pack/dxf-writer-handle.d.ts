/** dxf-writer's handle counter (a class with a static seed shared by every Drawing; no types shipped). */
declare module 'dxf-writer/src/Handle' {
  export default class Handle {
    static seed: number;
  }
}

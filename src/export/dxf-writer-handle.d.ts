/** dxf-writer's handle counter (src/Handle.js), shared by every drawing in the process; `DxfBuilder` restarts it. */
declare module 'dxf-writer/src/Handle.js' {
  const Handle: { seed: number };
  export default Handle;
}

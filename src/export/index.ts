export { TABLE_DECIMALS, formatNumber } from './format-number.js';
export { writeCsv } from './write-csv.js';
export {
  type DrawingModel,
  type DrawingRefusal,
  type DrawnActuator,
  type DrawnHole,
  type DrawnPart,
  type DrawnSlot,
  type DrawnStation,
  type DrawnTelescoping,
  drawingModel,
  PIN_HOLE_FIT_CLEARANCE_MM,
  type PartKind,
  SLOT_FIT_CLEARANCE_MM,
  STEPS_PER_TRANSITION,
  telescopingHalfLength,
} from './drawing-model.js';
export {
  CUT_TEMPERATURE_C,
  type DrawingDimensions,
  STEEL_EXPANSION_PER_K,
  type ThermalScale,
  thermalScale,
} from './thermal-scale.js';
export { DXF_DECIMALS, asciiText, wrapText } from './dxf-builder.js';
export { PART_LAYERS, partIds, writePartDxf } from './write-part-dxf.js';
export { layoutSheet, SHEET_GAP_MM, type SheetPlacement, writePartsSheetDxf } from './write-parts-sheet-dxf.js';
export { DIE_BODY_LAYERS, writeDieBodyDxf } from './write-die-body-dxf.js';
export { stationLayers, writeStationsDxf } from './write-stations-dxf.js';
export { type LinePlot, type PlotSeries, type PreviewPlots, previewPlots } from './preview-plots.js';
export { writePreviewSvg } from './write-preview-svg.js';

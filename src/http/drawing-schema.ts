import { z } from 'zod';

/** `?dimensions=cold|hot` of every drawing. */
export const DrawingQuery = z.object({
  dimensions: z
    .string()
    .optional()
    .describe(
      '`cold` (default): sizes to cut and measure at 20 °C, the plan geometry divided by 1 + α·(die temperature − 20 °C) with α = 11.3 µm/(m·K) (H13 hot-work steel, mean 20–204 °C, steel data sheets), so the die grows to the planned shape at its working temperature; `hot`: the plan geometry as it is (the die at working temperature). Every drawing states which. Anything else: 400 malformed_request',
    ),
});

export const DrawingPlanParams = z.object({ id: z.string().describe('plan id from POST /v1/plans') });

export const DrawingPartParams = z.object({
  id: z.string().describe('plan id from POST /v1/plans'),
  part: z
    .string()
    .describe(
      'part id: a mechanism body id from the plan (`plate_1` … `plate_N`, `plate_k_slide` for the sliding half of a telescoping pair, `slider_start` / `slider_end` for slot blocks, `link_1` … for binary links); the die body is /die-body.dxf',
    ),
});

export const DxfText = z
  .string()
  .describe(
    'DXF drawing (AutoCAD 2007 text format, application/dxf), millimetres ($INSUNITS 4): LWPOLYLINE outlines, CIRCLE pin holes, LINE centre marks, TEXT notes, layers named in plain words; notes state cold or hot dimensions, and the safety cautions are on every drawing',
  );

export const SvgText = z
  .string()
  .describe(
    'SVG document (image/svg+xml): station panels with target, achieved orifice and parts; plots against line position; cautions',
  );

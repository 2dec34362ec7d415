/**
 * Stripwright's strip geometry engine: pure functions, no I/O, relative imports only, so the
 * browser, the server and plain Node load the same code.
 */
export type { LngLat, LaneKind, LaneSpec, LayoutInput, Lane, Layout, CropTotals } from './types';
export { GeometryError, type GeometryErrorCode } from './errors';
export { layoutStrips, MAX_LANES } from './layout';
export { checkVertexCount, countPositions, MAX_FIELD_VERTICES } from './validate';
export { geodesicAcres, geodesicSquareMeters } from './area';
export { checkOutline } from './outline';
export { rotationMatrix, type RotationCell } from './rotation';
export { equipmentFit, type EquipmentFit } from './fit';
export { laneWidthFt, openMiddleIn, rowPositionsIn } from './pattern';

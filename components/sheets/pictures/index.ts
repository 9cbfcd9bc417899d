/**
 * Pictures for calculation sheets: a scaled busbar cross-section (pure SVG, server
 * rendered), the bus-network diagram (SVG, client) and four charts (client components
 * whose chart library loads on demand).
 * No data fetching: each takes engine results as props.
 */
export { BarCrossSection, crossSectionSummary, type BarCrossSectionProps } from "./bar-cross-section";
export { TemperatureCurve, type TemperatureCurveProps } from "./temperature-curve";
export { VoltageProfile, type VoltageProfileProps } from "./voltage-profile";
export { PathShares, type PathSharesProps } from "./path-shares";
export { HottestSegments, NetworkDiagram, segmentDescription, type NetworkDiagramProps } from "./network-diagram";
export { NetworkPathVoltage, type NetworkPathVoltageProps } from "./network-path";
export { NETWORK_DRAW_LIMIT, NETWORK_LABEL_LIMIT } from "./network-layout";
export {
  pathSharesFromParallel,
  toPathShareRows,
  toTemperatureSeries,
  toVoltageSeries,
  type ContingencyIn,
  type PathShareIn,
  type TemperaturePointIn,
  type VoltagePointIn,
  worstContingencyIndex,
} from "./series";
export type { PictureUnits } from "./units";

// The wheel engine: pure functions, millimetres inside, no I/O.

export { WheelInputError } from './errors';
export { MM_PER_INCH, G_PER_LB, inToMm, mmToIn, gToLb } from './units';
export * from './constants';
export { BSD_BY_NOMINAL_IN, NOMINAL_DIAMETERS_IN, SWG_MM, SPOKE_GAUGES, bsdForNominal, swgToMm, type NominalDiameterIn, type SpokeGauge } from './standards';
export * from './catalogue';
export { checkSection, rimOuterDiameterMm, sectionHalfWidthAt, tireOuterDiameterMm, tireSectionHeightMm, tireSectionWidthMm, topViewOutline, type WheelSection } from './section';
export * from './drivetrain';
export * from './spokes';
export * from './weight';
export { DEMO_PRICE_BOOK, FINISHES, type Finish, type PriceBook } from './priceBook';
export { estimateBaselineCost, type CostEstimate, type CostInput, type CostLine, type CostLineKey } from './cost';
export { CAUTIONS, checkFitment, evaluateDrive, frontHubOldNeededMm, hubClassLabel, type DriveSetup, type FitmentInput, type FitmentNeeds, type FitmentResult, type Verdict } from './fitment';
export * from './schema';
export { computeFit, parseFitRequest, type FitResult } from './computeFit';

/**
 * Armilla sky engine — public surface. Pure TypeScript (no DOM, React, three, Astro or database);
 * astronomy-engine provides the ephemerides. Angles in degrees, hour angles and sidereal times in
 * hours, instants as Date (UTC), ENU = [east, north, up].
 */
export type { SiteInput, FrameName } from './frames';
export {
  FRAME_NAMES, frameMatrix, icrsToFrameMatrix, convertDirection, convertDirections, vectorInFrame, anglesInFrame,
  equatorialToEcliptic, eclipticOfDate, galacticFromIcrs, icrsFromGalactic, npbMatrix, precessionMatrix, nutationMatrix,
  ICRS_TO_GALACTIC, ICRS_TO_ECLIPTIC_J2000, OBLIQUITY_J2000_DEG,
} from './frames';
export {
  jdFromDate, dateFromJd, deltaTSeconds, earthRotationAngleDeg, gmstHours, gastHours, lmstHours, lastHours, instantFromDate,
  utDaysFromDate, J2000_JD,
} from './timescales';
export type { Instant } from './timescales';
export { nutationIau2000b, meanObliquityRad, trueObliquityDeg } from './nutation';
export { skyFrame, observeIcrs, apparentFromIcrs, describeEnu } from './apparent';
export type { SkyFrame, HorizontalPlace, ApparentPlace } from './apparent';
export {
  STANDARD_CONDITIONS, refractionConstants, apparentAltitudeDeg, trueAltitudeDeg, refractionForTrueAltitudeDeg,
  bennettArcmin, saemundssonArcmin, isaPressureHPa, refractionAtObservedZenithArcsec,
} from './refraction';
export type { RefractionMode, RefractionConditions } from './refraction';
export { observe, observeAt } from './observe';
export type { Target, ObserveResult, ObserveOptions } from './observe';
export { bodies, bodyPlace, bodyVector, BODY_NAMES, isBodyName, moonAgeDays } from './bodies';
export type { BodyName, BodyPlace } from './bodies';
export { loadCatalogue, searchCatalogue, findByName, findByHr } from './catalogue';
export type { Catalogue, CatalogueHit } from './catalogue';
export { starsToHorizontal, starsToEnu, unitVectors, unitVectorsToEnu } from './stars';
export type { PositionSet, BatchOptions } from './stars';
export { greatCircles, greatCirclesAt, circlePoints, referencePoints, referencePointsAt, CIRCLE_NAMES, REFERENCE_POINT_NAMES } from './circles';
export type { CircleName, GreatCircle, SkyPoint, ReferencePoints, ReferencePointName, Enu } from './circles';
export { riseTransitSet, riseTransitSetDetailed, twilightEvents, skyEvents, nextEvent, moonPhases } from './events';
export type { EventKind, SkyEvent, RiseTransitSetResult, MoonPhaseKind } from './events';
export { airmassKastenYoung, airmassPickering, airmassSecant } from './airmass';
export { separationDeg, positionAngleDeg } from './angles';
export { constellationOf } from './constellation';
export { evaluateEnvelope, maskAltitudeDeg, prepareMask, azimuthMarginDeg } from './envelope';
export type { Envelope, LimitName, LimitCheck, Pointing, EnvelopeEvaluation, EnvelopeContext } from './envelope';
export { evaluateEnvelopeAt } from './pointing';
export { visibilityWindows } from './windows';
export type { WindowTarget, VisibilityWindow, TargetWindows } from './windows';

/**
 * The one place that imports astronomy-engine and configures it process-wide: every other sky
 * module imports `Astronomy` from here, so the ΔT model of time.ts is installed before any call.
 */
import * as Astronomy from 'astronomy-engine';
import { deltaTSeconds, J2000_JD } from './timescales';

Astronomy.SetDeltaTFunction((utDays: number) => deltaTSeconds(utDays + J2000_JD));

export { Astronomy };
export const KM_PER_AU = Astronomy.KM_PER_AU;



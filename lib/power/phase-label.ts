// Phase labels moved to lib/channel-identity.ts (one set of channel-name rules for importers and pairing);
// lib/power keeps exporting them for its callers.
export {
	inferPhaseFamily,
	parsePhaseLabel,
	phaseDisplayLabel,
	resolvePhaseToken,
	type ParsedPhaseLabel,
	type PhaseFamily,
	type PhaseIndex,
} from '../channel-identity.js';

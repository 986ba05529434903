/**
 * The one list of block types. Adding a type means adding its file under blocks/ and one line here.
 */
import type { BlockTypeDefinition } from './block-type';
import { advectiveGeotherm } from './blocks/advective-geotherm';
import { closureExhumation } from './blocks/closure-exhumation';
import { cosmogenicDenudation } from './blocks/cosmogenic-denudation';
import { orogenFluxBalance } from './blocks/orogen-flux-balance';
import { plateFlexure } from './blocks/plate-flexure';
import { radiogenicGeotherm } from './blocks/radiogenic-geotherm';
import { strengthEnvelope } from './blocks/strength-envelope';
import { channelMarch } from './blocks/channel-march';
import { denudationConversion } from './blocks/denudation-conversion';
import { formula } from './blocks/formula';
import { hillslopeDiffusion } from './blocks/hillslope-diffusion';
import { hilltopErosion } from './blocks/hilltop-erosion';
import { isostaticResponse } from './blocks/isostatic-response';
import { netChange } from './blocks/net-change';
import { note } from './blocks/note';
import { pecletNumber } from './blocks/peclet-number';
import { profileEvolution } from './blocks/profile-evolution';
import { quantities } from './blocks/quantities';
import { scarpAge } from './blocks/scarp-age';
import { scarpFit } from './blocks/scarp-fit';
import { scarpForward } from './blocks/scarp-forward';
import { steadyStateChannel } from './blocks/steady-state-channel';
import { streamPower } from './blocks/stream-power';
import { transportCapacity } from './blocks/transport-capacity';

export const BLOCK_TYPES: readonly BlockTypeDefinition[] = [
  quantities,
  formula,
  note,
  hillslopeDiffusion,
  hilltopErosion,
  scarpForward,
  scarpAge,
  transportCapacity,
  netChange,
  pecletNumber,
  advectiveGeotherm,
  streamPower,
  steadyStateChannel,
  isostaticResponse,
  denudationConversion,
  scarpFit,
  profileEvolution,
  channelMarch,
  // Tectonic and field-method types (CONTRACT §4b).
  radiogenicGeotherm,
  strengthEnvelope,
  orogenFluxBalance,
  plateFlexure,
  cosmogenicDenudation,
  closureExhumation,
];

const byId = new Map(BLOCK_TYPES.map((type) => [type.id, type]));

export const BLOCK_TYPE_IDS = BLOCK_TYPES.map((type) => type.id) as [string, ...string[]];

export function getBlockType(id: string): BlockTypeDefinition | undefined {
  return byId.get(id);
}

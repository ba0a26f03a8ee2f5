/**
 * The deck view's colours, shared with the 2D panels (lane swatches, legends) without
 * pulling three.js into their bundle.
 */
export const SCENE_COLOURS = {
  background: '#eef1ec',
  slab: '#d9ddd5',
  roadway: '#c3c9c0',
  steel: '#6f8aa3',
  precast: '#b8ad97',
  studied: '#d9902b',
  barrier: '#a0a79f',
  support: '#7d5f8e',
  girderLine: '#51676b',
  wheel: '#263238',
  axle: '#46565a',
  label: '#1f3d44',
  lanes: ['#2f8f83', '#4c7dbb', '#8f6bb5', '#c07048', '#5f9a3c', '#b5577a', '#3f8fa8', '#a38a2f'],
} as const;

export function laneColour(i: number): string {
  return SCENE_COLOURS.lanes[i % SCENE_COLOURS.lanes.length];
}


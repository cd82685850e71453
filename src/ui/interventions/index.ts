export { HoldControl, HoldControlFor } from './HoldControl';
export { CommutationPanel, CommutationPanelFor } from './CommutationPanel';
export { useHolds, setHold, releaseHold, releaseAllHolds } from './holds';

export { HoldControl, HoldControlFor } from './HoldControl';
export { CommutationPanel, CommutationPanelFor } from './CommutationPanel';
export { holdStore, useHolds, startHoldSync, createHoldStore } from './holds';

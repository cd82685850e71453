/** The integer-step mode: measured graphs at rate u and the causal-step graphs behind them. */
export * from './graph';
export * from './inverse';
export * from './file';
export * from './edit';

/**
 * Number and name formatting of the figures: src/present/ owns it; these
 * names stay for the figure code that imports them from here.
 */
export { numText, weightText, unitOf, labelOf as nameOf } from '../present/index';

/** The engineering feature's public face: the engineer home's panel. */
export { EngineeringHomePanel } from './HomePanel';

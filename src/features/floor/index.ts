/** The floor feature's public face: the links panel the foreman's and the floor's homes show. */
export { FloorHomePanel } from './HomePanel';

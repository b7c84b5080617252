import type { Role } from '../../contracts/roles';

/** What each role does in the shop, in our words (after the roles table of the product brief). */
export const ROLE_WORK: Record<Role, { title: string; summary: string; duties: string[] }> = {
  admin: {
    title: 'Shop administration',
    summary: 'You keep Spoolwright itself in order: who may sign in and with which role, the stations on the floor, and the shop constants the engineers rely on.',
    duties: [
      'Add people, give each the role that matches their work, and close accounts when someone leaves.',
      'Set new passwords when someone is locked out.',
      'Keep an eye on the services Spoolwright runs on.',
      'You may open every part of the system.',
    ],
  },
  office: {
    title: 'Office',
    summary: 'Orders come in through you: you enter what the customer asked for, attach their drawings, and answer when they ask where their order is.',
    duties: [
      'Enter customer orders, one line per coil requirement.',
      'Upload the drawings and specifications that came with an order.',
      'Look up work orders to tell a customer how far their coils are.',
    ],
  },
  engineer: {
    title: 'Engineering',
    summary: 'You turn each order line’s requirement into a build sheet a winder can follow — wire, turns, layers, expected resistance and temperature rise — check it, and release it to the floor.',
    duties: [
      'Design and check build sheets against the requirement and the insulation class.',
      'Keep the wire and core materials tables right.',
      'Release checked build sheets as work orders.',
      'Read everything else in the shop to answer questions.',
    ],
  },
  foreman: {
    title: 'Floor lead',
    summary: 'You run the floor: you set priorities, give work to people and stations, hold jobs that must wait, and decide what happens to a coil that failed its test.',
    duties: [
      'Watch all work on the floor in one place.',
      'Assign and reassign jobs to people and stations.',
      'Move any job to any stage, or put it on hold.',
      'Decide on failed units: rework, scrap or accept.',
    ],
  },
  floor: {
    title: 'Winding floor',
    summary: 'You build the coils: winding, terminating, varnishing and testing. You record what you actually built and what you measured, and pass each job on to its next stage.',
    duties: [
      'Work through your own queue, one traveler at a time.',
      'Record the turns count, wire lot and station you used.',
      'Record test readings; the system judges them against the build sheet.',
      'Move each job on when your stage is done.',
    ],
  },
  shipping: {
    title: 'Shipping',
    summary: 'You pack finished coils, send them on their way, and tell the customer what is coming — with the tracking number and the certificate.',
    duties: [
      'Pack finished work and print packing lists.',
      'Record each shipment with carrier and tracking number.',
      'Send the customer their shipment notice and certificate of conformance.',
    ],
  },
  customer: {
    title: 'Customer account',
    summary: 'This account lets you follow what your company has ordered from the shop. It is read-only: nothing you do here changes an order.',
    duties: [
      'See your own company’s orders and how far each has come.',
      'See shipments with their tracking numbers.',
      'Download certificates of conformance for what was shipped.',
    ],
  },
};

/**
 * Where each engine warning belongs on the sheet, and the caution that goes with it. The engine's
 * own message says what is wrong; the caution says why it matters to the people in the shop.
 */
export type WarningPlace = 'temperature' | 'fit' | 'magnetic' | 'currentDensity' | 'switchOff' | 'general';

export function placeOf(code: string): WarningPlace {
  switch (code) {
    case 'over-temperature':
    case 'thermal-runaway':
      return 'temperature';
    case 'does-not-fit':
      return 'fit';
    case 'saturation':
      return 'magnetic';
    case 'current-density':
      return 'currentDensity';
    case 'no-suppression':
      return 'switchOff';
    default:
      return 'general';
  }
}

export const CAUTIONS: Partial<Record<string, string>> = {
  'over-temperature':
    'Fire risk: insulation run above its thermal class ages fast and can smoke or catch fire, and the coil’s surface can burn a hand. Choose another wire, a lower duty or a higher class — or write down why this is acceptable.',
  'thermal-runaway':
    'Fire risk: the winding finds no steady temperature — each degree raises the resistance and the heat until the insulation fails. Do not build this as drawn.',
  saturation: 'The iron saturates: more ampere-turns add little pull or field, only heat.',
  'does-not-fit': 'The winding builds past the bobbin’s outer limit; the floor cannot wind it. Change the wire or the turns.',
  'current-density': 'The current density is high for this duty; check the temperature margin before approving.',
  'no-suppression':
    'Danger at switch-off: the collapsing field drives the voltage up until the contacts arc or the insulation or transistor breaks down. Specify a diode, diode and Zener, or TVS across the coil.',
};

/** Where each of the engine's cautions (people can get hurt) sits on the sheet. */
export function cautionPlace(code: string): WarningPlace | 'electrical' {
  switch (code) {
    case 'switch-off':
      return 'switchOff';
    case 'stored-charge':
      return 'electrical';
    case 'hot-surface':
      return 'temperature';
    case 'strong-field':
    case 'pinch':
    case 'lifting':
      return 'magnetic';
    default:
      return 'general';
  }
}

export const PULL_CAUTION =
  'A computed pull is not a lifting rating: for lifting or holding use, apply the lifting-device standard and prove the magnet by test with a safety factor.';

export function warningKind(code: string): 'fault' | 'caution' {
  return code === 'over-temperature' || code === 'thermal-runaway' || code === 'does-not-fit' ? 'fault' : 'caution';
}

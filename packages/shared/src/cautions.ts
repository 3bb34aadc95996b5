// Safety cautions shown when a kind of work is picked. They are reminders of
// the usual precautions of the trade, not a safety programme: every text ends
// by deferring to local codes, the product label and licensed practice.
// Wording is the product's own ("common practice, no source").

export const CAUTION_KEYS = ['roadside', 'road-travel', 'thrown-debris', 'pto', 'anhydrous', 'chemical', 'digging'] as const;
export type CautionKey = (typeof CAUTION_KEYS)[number];

export interface Caution {
  key: CautionKey;
  title: string;
  points: readonly string[];
  defersTo: string;
}

const DEFER_TO_LOCAL_RULES =
  'These are reminders only: local traffic, work-zone and equipment codes, the road authority and licensed practice come first.';

export const CAUTIONS: Readonly<Record<CautionKey, Caution>> = {
  roadside: {
    key: 'roadside',
    title: 'Working beside traffic',
    points: [
      'Display a clean slow-moving-vehicle emblem and run the flashing amber lights and beacons the whole time you are on the right-of-way.',
      'Wear high-visibility clothing; set out the signs the road authority asks for before starting.',
      'Mow with traffic, keep the tractor off the travelled lane, and stop the cutter when people or vehicles are near.',
      'Watch for culverts, signposts, guard rails, drop-offs and wet slopes that can tip a tractor.',
    ],
    defersTo: DEFER_TO_LOCAL_RULES,
  },
  'road-travel': {
    key: 'road-travel',
    title: 'Moving machines on public roads',
    points: [
      'Slow-moving-vehicle emblem, flashing amber lights and reflectors in place and clean; lights on in poor visibility.',
      'Fold or lock implements to transport width and fit safety chains on towed loads.',
      'Check the route for low wires, narrow bridges and weight limits; pull over to let traffic pass where it is safe.',
    ],
    defersTo: DEFER_TO_LOCAL_RULES,
  },
  'thrown-debris': {
    key: 'thrown-debris',
    title: 'Thrown objects from rotary cutters',
    points: [
      'A rotary cutter can throw stones, glass and wire a long way: keep chain or band guards and deflectors in place.',
      'Walk the ground for debris first; stop the blades when anyone, a vehicle or livestock is within range.',
      'Never lift the deck with the blades turning near people or the road.',
    ],
    defersTo: 'These are reminders only: the operator’s manual, local codes and licensed practice come first.',
  },
  pto: {
    key: 'pto',
    title: 'PTO shafts and hydraulics',
    points: [
      'Keep every PTO shield and driveline guard in place and turning freely; replace damaged guards before work.',
      'Disengage the PTO, stop the engine and take the key before clearing, adjusting or unhitching.',
      'No loose clothing, strings or long hair near a turning shaft.',
      'Never feel for hydraulic leaks by hand: pressurised oil can pierce skin. Lower or block raised implements before working under them.',
    ],
    defersTo: 'These are reminders only: the operator’s manual, local codes and licensed practice come first.',
  },
  anhydrous: {
    key: 'anhydrous',
    title: 'Anhydrous ammonia',
    points: [
      'Only trained handlers connect, disconnect or work on tanks and applicators.',
      'Wear chemical splash goggles (or a face shield over goggles) and ammonia-rated rubber gloves; carry a personal eyewash bottle.',
      'Keep at least five gallons of clean water on the nurse tank and on the tractor.',
      'Check hoses, valves, couplers and the breakaway before each use; bleed pressure before disconnecting; stand upwind.',
    ],
    defersTo: 'These are reminders only: the supplier’s instructions, the safety data sheet, local codes and licensed practice come first.',
  },
  chemical: {
    key: 'chemical',
    title: 'Crop protection products and fertilizer',
    points: [
      'The label is the law: follow its rates, protective equipment, re-entry intervals, buffer zones and wind limits.',
      'Restricted-use products are applied by, or under, a licensed applicator.',
      'Mix and load away from wells and water; keep clean water and the safety data sheet at hand.',
    ],
    defersTo: 'These are reminders only: the product label, local codes and licensed practice come first.',
  },
  digging: {
    key: 'digging',
    title: 'Digging and trenching',
    points: [
      'Have buried utilities located and marked before you dig, as the local one-call rules require.',
      'Keep people out of trenches that are not sloped or shored, and clear of the plow or trencher.',
    ],
    defersTo: 'These are reminders only: one-call and excavation codes, the drainage permit and licensed practice come first.',
  },
};

/** Shown beside every cost or rate figure the product computes. */
export const ESTIMATE_NOTICE =
  'Rates and cost figures are estimates by the published machinery-cost method and your own records; they are not tax, legal or accounting advice.';

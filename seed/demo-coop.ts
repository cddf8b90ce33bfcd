/**
 * The demo scenario: an invented co-op of five farms in an invented county. Every person, farm and
 * place here is fictional.
 */
export const DEMO_PASSWORD = 'burrowline-demo';

export const demoCoop = {
  name: 'Larkspur Hollow Rabbit Cooperative',
  slug: 'larkspur-hollow',
  currency: 'USD',
  quarantineDays: 30,
  rulesText: [
    'Members keep their herds free of known disease and report any sudden deaths to the coordinator within a day.',
    'Every animal that arrives from outside the co-op, or returns from a loan, is isolated for the quarantine period before it joins the herd.',
    'Stud bucks are lent with their papers and returned in the condition they left in.',
    'Meat is sold only where the member has checked their own state and local rules.',
  ].join('\n\n'),
};

type DemoFarm = {
  key: string;
  profile: {
    name: string;
    location: string;
    timeZone: string;
    weightUnit: 'lb_oz' | 'kg_g';
    temperatureUnit: 'F' | 'C';
    breedsKept: string[];
    description: string;
  };
  people: { email: string; name: string; role: 'admin' | 'member' }[];
};

export const demoFarms: DemoFarm[] = [
  {
    key: 'quillfeather',
    profile: {
      name: 'Quillfeather Farm',
      location: 'Fennick Ridge, Tamsin County',
      timeZone: 'America/Chicago',
      weightUnit: 'lb_oz',
      temperatureUnit: 'F',
      breedsKept: ['New Zealand', 'Californian'],
      description: 'Forty holes under a pole barn on the ridge. We keep the co-op\'s records straight and host the spring processing day.',
    },
    people: [{ email: 'admin@demo.test', name: 'Odalys Brenner', role: 'admin' }],
  },
  {
    key: 'hazelrun',
    profile: {
      name: 'Hazelrun Rabbitry',
      location: 'Hazelrun Road, Millbrae Township, Tamsin County',
      timeZone: 'America/Chicago',
      weightUnit: 'lb_oz',
      temperatureUnit: 'F',
      breedsKept: ['Silver Fox', 'New Zealand'],
      description: 'A family rabbitry raising Silver Fox and New Zealand fryers on pellets and hay, with a colony pen for the retired does.',
    },
    people: [
      { email: 'member@demo.test', name: 'Marisol Okafor-Vance', role: 'member' },
      { email: 'teodor@demo.test', name: 'Teodor Vance', role: 'member' },
    ],
  },
  {
    key: 'cobble-creek',
    profile: {
      name: 'Cobble Creek Homestead',
      location: 'Cobble Creek, Tamsin County',
      timeZone: 'America/Chicago',
      weightUnit: 'kg_g',
      temperatureUnit: 'C',
      breedsKept: ['Champagne d\'Argent', 'Satin'],
      description: 'Small hutch line under the oaks; Champagne and Satin crosses for a steady fryer supply.',
    },
    people: [{ email: 'priya@demo.test', name: 'Priya Lindqvist', role: 'member' }],
  },
  {
    key: 'wrenfield',
    profile: {
      name: 'Wrenfield Acres',
      location: 'Wrenfield, Tamsin County',
      timeZone: 'America/Chicago',
      weightUnit: 'lb_oz',
      temperatureUnit: 'F',
      breedsKept: ['Californian', 'Palomino'],
      description: 'Californians and Palominos raised for the farm stand, with a spare buck or two to lend.',
    },
    people: [{ email: 'dashiell@demo.test', name: 'Dashiell Moreau', role: 'member' }],
  },
  {
    key: 'saltbush',
    profile: {
      name: 'Saltbush Meadow',
      location: 'Saltbush Flats, Tamsin County',
      timeZone: 'America/Chicago',
      weightUnit: 'lb_oz',
      temperatureUnit: 'F',
      breedsKept: ['Rex', 'New Zealand'],
      description: 'A newer member farm building a New Zealand line and a few Rex for pelts.',
    },
    people: [{ email: 'ines@demo.test', name: 'Ines Haverford', role: 'member' }],
  },
];

/** The apprentice learns under member@demo.test on Hazelrun Rabbitry. */
export const demoApprentice = { email: 'apprentice@demo.test', name: 'Juniper Ashgrove', mentorEmail: 'member@demo.test' };

/** A second apprentice, learning under priya@demo.test (her own mentor, so each mentor sees only her own). */
export const demoSecondApprentice = { email: 'apprentice2@demo.test', name: 'Rowan Thistlewood', mentorEmail: 'priya@demo.test' };

/**
 * The demo herds of Larkspur Hollow: every name, tattoo, registration number and outside rabbitry
 * here is invented. A few lines are written out (so the pedigrees tell a story: a half-sib mating
 * at Hazelrun with Quillfeather's buck, NZ stock passed from Quillfeather to Saltbush, auction does
 * of unknown ancestry at Saltbush); the later generations are bred by a seeded random program, so
 * every load is the same. Dates count back from today on the farms' clock, so kits stay kits.
 */
import { randomUUID } from 'node:crypto';
import type { Transaction } from 'sequelize';
import { addDays, todayIn, type BreedDto, type Sex } from '@burrowline/shared';
import { importHerd, importWeighIns, type ImportedAnimal, type ImportedWeighIn } from '../packages/server/src/modules/animals/herd-import.service';
import { breedsOf } from '../packages/server/src/modules/breeds/breeds.service';
import { seededRandom } from '../packages/shared/src/pedigree/seeded-random';

export interface DemoHerdContext {
  coopId: string;
  /** Farm id by demo farm key (quillfeather, hazelrun, cobble-creek, wrenfield, saltbush). */
  farms: Map<string, string>;
  /** The member who keeps each farm's records, by farm key. */
  keepers: Map<string, string>;
  apprenticeId: string | null;
}

const names = [
  'Bramble', 'Thistle', 'Clover', 'Sorrel', 'Fennel', 'Juniper', 'Hazel', 'Rowan', 'Tansy', 'Marigold', 'Wren', 'Alder', 'Birch',
  'Fern', 'Poppy', 'Saffron', 'Nutmeg', 'Pepper', 'Ember', 'Cinder', 'Dusk', 'Maple', 'Acorn', 'Barley', 'Oat', 'Rye', 'Millet',
  'Chicory', 'Yarrow', 'Sage', 'Basil', 'Dill', 'Caraway', 'Mallow', 'Heather', 'Bracken', 'Flint', 'Slate', 'Pebble', 'Cobble',
  'Brook', 'Willow', 'Aspen', 'Larch', 'Sedge', 'Reed', 'Rush', 'Teasel', 'Burdock', 'Campion', 'Sparrow', 'Finch', 'Linnet',
  'Thrush', 'Plover', 'Quail', 'Ridley', 'Mabel', 'Hattie', 'Otis', 'Gus', 'Ida', 'Nell', 'Rufus', 'Percy', 'Clem', 'Dot', 'Ivy',
  'Lottie', 'Mott', 'Pip', 'Bea', 'Jasper', 'Moss', 'Stella', 'Hugo', 'Tilly', 'Arlo', 'Wilma', 'Boone', 'Della', 'Ozzie', 'Ruth',
  'Silas', 'Vera', 'Abe', 'Cora', 'Fritz', 'Greta', 'Hank', 'June', 'Kip', 'Lula', 'Milo', 'Nora', 'Opie', 'Pru', 'Quincy', 'Rosie',
  'Sully', 'Tess', 'Ulla', 'Vic', 'Winnie', 'Yates', 'Zinnia', 'Biscuit', 'Crumb', 'Dumpling', 'Gingham', 'Muffin', 'Pudding',
  'Scone', 'Toffee', 'Waffle', 'Cocoa', 'Truffle', 'Bluebell', 'Cowslip', 'Daisy', 'Foxglove', 'Primrose', 'Snowdrop', 'Violet',
];

interface FarmPlan {
  key: string;
  prefix: string;
  /** Breeds the farm breeds pure; `cross` lists [doe breed, buck breed] pairings it uses for fryers. */
  pure: string[];
  cross?: [string, string];
}

const plans: FarmPlan[] = [
  { key: 'quillfeather', prefix: 'QF', pure: ['New Zealand', 'Californian'], cross: ['New Zealand', 'Californian'] },
  { key: 'hazelrun', prefix: 'HR', pure: ['Silver Fox', 'New Zealand'] },
  { key: 'cobble-creek', prefix: 'CC', pure: ["Champagne d'Argent", 'Satin'], cross: ["Champagne d'Argent", 'Satin'] },
  { key: 'wrenfield', prefix: 'WA', pure: ['Californian', 'Palomino'], cross: ['Palomino', 'Californian'] },
  { key: 'saltbush', prefix: 'SM', pure: ['Rex', 'New Zealand'] },
];

const colours: Record<string, string[]> = {
  'New Zealand': ['White', 'White', 'Black', 'Red'],
  Californian: ['White with black points'],
  'Silver Fox': ['Black', 'Black', 'Blue'],
  Palomino: ['Golden', 'Lynx'],
  Rex: ['Castor', 'Black', 'Opal'],
  "Champagne d'Argent": ['Silver'],
  Satin: ['Copper', 'Chocolate', 'Red'],
  'American Chinchilla': ['Chinchilla'],
  'Florida White': ['White'],
  'Flemish Giant': ['Sandy'],
};

export async function loadDemoHerds(ctx: DemoHerdContext, tx: Transaction): Promise<{ animals: number; weighIns: number }> {
  const random = seededRandom(20_260_401);
  const pick = <T>(list: readonly T[]): T => list[Math.floor(random() * list.length)]!;
  const today = todayIn('America/Chicago');
  const breedList = await breedsOf(ctx.coopId, tx);
  const breed = (name: string): BreedDto => {
    const found = breedList.find((b) => b.name === name);
    if (!found) throw new Error(`The catalogue lacks ${name}`);
    return found;
  };
  const farm = (key: string) => ctx.farms.get(key)!;

  const animals: ImportedAnimal[] = [];
  /** Breed names of each animal's make-up, for colours and growth curves. */
  const lineage = new Map<string, string[]>();
  const counters = new Map<string, number>();
  const usedNames = new Map<string, Set<string>>();
  const nameFor = (farmKey: string) => {
    const used = usedNames.get(farmKey) ?? new Set<string>();
    usedNames.set(farmKey, used);
    for (let tries = 0; tries < 50; tries++) {
      const candidate = pick(names);
      if (!used.has(candidate)) {
        used.add(candidate);
        return candidate;
      }
    }
    return `${pick(names)} ${used.size}`;
  };
  const tattooFor = (plan: FarmPlan) => {
    const n = (counters.get(plan.key) ?? 0) + 1;
    counters.set(plan.key, n);
    return `${plan.prefix}-${n}`;
  };

  // Outside ancestors, known from their papers (invented rabbitries beyond the co-op).
  const outside = (name: string, sex: Sex, breedName: string, registrationNumber: string, breederName: string, birthDate: string, sireId: string | null = null, damId: string | null = null) => {
    const id = randomUUID();
    animals.push({
      id, farmId: null, breedingFarmId: null, breederName, tattoo: null, name, sex, breedId: breed(breedName).id,
      colour: pick(colours[breedName] ?? ['']), birthDate, sireId, damId, registrationNumber,
    });
    lineage.set(id, [breedName]);
    return id;
  };
  const yearsAgo = (years: number, extraDays = 0) => addDays(today, -Math.round(years * 365) + extraDays);

  // Thornbury's papers go back a generation further: Ardent and Lark share their sire.
  const tbHale = outside('Thornbury Hale', 'buck', 'New Zealand', 'TB-802', 'Thornbury Rabbitry', yearsAgo(7.5));
  const tbWren = outside('Thornbury Wren', 'doe', 'New Zealand', 'TB-815', 'Thornbury Rabbitry', yearsAgo(7.2));
  const tbMoth = outside('Thornbury Moth', 'doe', 'New Zealand', 'TB-840', 'Thornbury Rabbitry', yearsAgo(7));
  const tbArdent = outside('Thornbury Ardent', 'buck', 'New Zealand', 'TB-1041', 'Thornbury Rabbitry', yearsAgo(5.5), tbHale, tbWren);
  const tbLark = outside('Thornbury Lark', 'doe', 'New Zealand', 'TB-1102', 'Thornbury Rabbitry', yearsAgo(5.2), tbHale, tbMoth);
  const tbVesper = outside('Thornbury Vesper', 'doe', 'New Zealand', 'TB-1188', 'Thornbury Rabbitry', yearsAgo(5));
  const mrGideon = outside('Millrace Gideon', 'buck', 'New Zealand', 'MR-220', 'Millrace Farm', yearsAgo(5.4));
  const mrOpal = outside('Millrace Opal', 'doe', 'New Zealand', 'MR-231', 'Millrace Farm', yearsAgo(5.1));
  const qbSable = outside('Quarry Bend Sable', 'buck', 'Californian', 'QB-77', 'Quarry Bend Rabbitry', yearsAgo(5.3));
  const qbIvy = outside('Quarry Bend Ivy', 'doe', 'Californian', 'QB-81', 'Quarry Bend Rabbitry', yearsAgo(5));
  const agSlate = outside('Ashgrove Slate', 'buck', 'Silver Fox', 'AG-310', 'Ashgrove Hollow', yearsAgo(5.2));
  const agMisty = outside('Ashgrove Misty', 'doe', 'Silver Fox', 'AG-322', 'Ashgrove Hollow', yearsAgo(5));
  const lmPewter = outside('Larchmont Pewter', 'buck', "Champagne d'Argent", 'LM-12', 'Larchmont Rabbitry', yearsAgo(5.3));
  const lmFrost = outside('Larchmont Frost', 'doe', "Champagne d'Argent", 'LM-19', 'Larchmont Rabbitry', yearsAgo(5));
  const bfCopper = outside('Brackenfold Copper', 'buck', 'Satin', 'BF-5', 'Brackenfold', yearsAgo(5.2));
  const bfDove = outside('Brackenfold Dove', 'doe', 'Satin', 'BF-8', 'Brackenfold', yearsAgo(5));
  const ghRusk = outside('Goldhill Rusk', 'buck', 'Palomino', 'GH-44', 'Goldhill Rabbitry', yearsAgo(5.3));
  const ghHoney = outside('Goldhill Honey', 'doe', 'Palomino', 'GH-47', 'Goldhill Rabbitry', yearsAgo(5));
  const vdSooty = outside('Velvetdown Sooty', 'buck', 'Rex', 'VD-3', 'Velvetdown', yearsAgo(5.2));
  const vdCastor = outside('Velvetdown Castor', 'doe', 'Rex', 'VD-6', 'Velvetdown', yearsAgo(5));

  const planOf = (key: string) => plans.find((p) => p.key === key)!;
  const sexOf = new Map<string, Sex>();
  const birthOf = new Map<string, string>();
  const farmOf = new Map<string, string>();
  const goneOn = new Map<string, string>();
  for (const a of animals) {
    sexOf.set(a.id, a.sex);
    birthOf.set(a.id, a.birthDate!);
  }

  /** A founder of a farm: bought from an outside breeder with papers (or at auction without). */
  const founder = (farmKey: string, spec: { name: string; sex: Sex; breed: string | null; sire?: string; dam?: string; ageYears: number; hutch: string; notes?: string }) => {
    const plan = planOf(farmKey);
    const id = randomUUID();
    const birthDate = yearsAgo(spec.ageYears);
    const parentsBreed = spec.sire && spec.dam ? [...(lineage.get(spec.sire) ?? []), ...(lineage.get(spec.dam) ?? [])] : spec.breed ? [spec.breed] : [];
    animals.push({
      id, farmId: farm(farmKey), breedingFarmId: null,
      breederName: spec.sire ? (animals.find((x) => x.id === spec.sire)?.breederName ?? '') : 'Tamsin County small-stock auction',
      tattoo: tattooFor(plan), name: spec.name, sex: spec.sex, breedId: spec.breed ? breed(spec.breed).id : null,
      colour: spec.breed ? pick(colours[spec.breed] ?? ['']) : pick(['Agouti', 'Broken black', 'Tort']), birthDate,
      sireId: spec.sire ?? null, damId: spec.dam ?? null, hutch: spec.hutch, notes: spec.notes ?? '', lifecycle: 'breeding',
      arrivedOn: addDays(birthDate, 120),
    });
    if (!usedNames.has(farmKey)) usedNames.set(farmKey, new Set());
    usedNames.get(farmKey)!.add(spec.name);
    lineage.set(id, parentsBreed);
    sexOf.set(id, spec.sex);
    birthOf.set(id, birthDate);
    farmOf.set(id, farmKey);
    return id;
  };

  // Quillfeather: the co-op's New Zealand and Californian line.
  const bramwell = founder('quillfeather', { name: "Ardent's Bramwell", sex: 'buck', breed: 'New Zealand', sire: tbArdent, dam: tbLark, ageYears: 3.6, hutch: 'S1', notes: 'Herd sire; steady growth in his fryers.' });
  founder('quillfeather', { name: 'Sable Junior', sex: 'buck', breed: 'Californian', sire: qbSable, dam: qbIvy, ageYears: 3.4, hutch: 'S2' });
  founder('quillfeather', { name: 'Larkin', sex: 'doe', breed: 'New Zealand', sire: mrGideon, dam: mrOpal, ageYears: 3.5, hutch: 'D1' });
  founder('quillfeather', { name: 'Opaline', sex: 'doe', breed: 'New Zealand', sire: mrGideon, dam: mrOpal, ageYears: 3.3, hutch: 'D2' });
  founder('quillfeather', { name: 'Ivy Belle', sex: 'doe', breed: 'Californian', sire: qbSable, dam: qbIvy, ageYears: 3.2, hutch: 'D3' });
  // Hazelrun: Silver Fox, and New Zealand from the same Thornbury buck as Quillfeather's.
  const willowmere = founder('hazelrun', { name: 'Willowmere', sex: 'doe', breed: 'New Zealand', sire: tbArdent, dam: tbVesper, ageYears: 3.5, hutch: 'A2', notes: 'Big litters, fusses over the nest box.' });
  founder('hazelrun', { name: 'Slate Junior', sex: 'buck', breed: 'Silver Fox', sire: agSlate, dam: agMisty, ageYears: 3.4, hutch: 'B1' });
  founder('hazelrun', { name: 'Misty Dawn', sex: 'doe', breed: 'Silver Fox', sire: agSlate, dam: agMisty, ageYears: 3.3, hutch: 'A1' });
  founder('hazelrun', { name: 'Pewter', sex: 'doe', breed: 'Silver Fox', sire: agSlate, dam: agMisty, ageYears: 3.1, hutch: 'A3' });
  // Cobble Creek: Champagne and Satin.
  founder('cobble-creek', { name: 'Pewter King', sex: 'buck', breed: "Champagne d'Argent", sire: lmPewter, dam: lmFrost, ageYears: 3.5, hutch: '1' });
  founder('cobble-creek', { name: 'Coppertop', sex: 'buck', breed: 'Satin', sire: bfCopper, dam: bfDove, ageYears: 3.3, hutch: '2' });
  founder('cobble-creek', { name: 'Frostine', sex: 'doe', breed: "Champagne d'Argent", sire: lmPewter, dam: lmFrost, ageYears: 3.4, hutch: '3' });
  founder('cobble-creek', { name: 'Dovetail', sex: 'doe', breed: 'Satin', sire: bfCopper, dam: bfDove, ageYears: 3.2, hutch: '4' });
  founder('cobble-creek', { name: 'Silverbell', sex: 'doe', breed: "Champagne d'Argent", sire: lmPewter, dam: lmFrost, ageYears: 3.1, hutch: '5' });
  // Wrenfield: Californian and Palomino.
  founder('wrenfield', { name: 'Rusk', sex: 'buck', breed: 'Palomino', sire: ghRusk, dam: ghHoney, ageYears: 3.5, hutch: 'N1' });
  founder('wrenfield', { name: 'Honeycomb', sex: 'doe', breed: 'Palomino', sire: ghRusk, dam: ghHoney, ageYears: 3.4, hutch: 'N2' });
  founder('wrenfield', { name: 'Quarry Rose', sex: 'doe', breed: 'Californian', sire: qbSable, dam: qbIvy, ageYears: 3.3, hutch: 'N3' });
  founder('wrenfield', { name: 'Goldie', sex: 'doe', breed: 'Palomino', sire: ghRusk, dam: ghHoney, ageYears: 3.2, hutch: 'N4' });
  // Saltbush: Rex, a New Zealand buck from Quillfeather's line, and auction does of unknown ancestry.
  founder('saltbush', { name: 'Sooty', sex: 'buck', breed: 'Rex', sire: vdSooty, dam: vdCastor, ageYears: 3.4, hutch: 'R1' });
  founder('saltbush', { name: 'Velvet', sex: 'doe', breed: 'Rex', sire: vdSooty, dam: vdCastor, ageYears: 3.3, hutch: 'R2' });
  founder('saltbush', { name: 'Auction Annie', sex: 'doe', breed: null, ageYears: 3.2, hutch: 'R3', notes: 'Bought at auction, no papers; good mother.' });
  founder('saltbush', { name: 'Auction Bess', sex: 'doe', breed: null, ageYears: 3.0, hutch: 'R4', notes: 'Bought at auction, no papers.' });

  /** A litter: records `kits` kits; keeps some, sends the rest to processing at 11 weeks. */
  const litter = (farmKey: string, sireId: string, damId: string, birthDate: string, spec: { kits: number; keep: number; names?: string[]; hutch?: string }) => {
    const plan = planOf(farmKey);
    const born: string[] = [];
    for (let k = 0; k < spec.kits; k++) {
      const id = randomUUID();
      const sex: Sex = k === 0 && spec.names?.[0] ? 'doe' : random() < 0.5 ? 'buck' : 'doe';
      const keep = k < spec.keep;
      const age = Date.parse(today) - Date.parse(birthDate);
      const ageDays = age / 86_400_000;
      const processedOn = addDays(birthDate, 77 + Math.floor(random() * 10));
      const gone = !keep && processedOn < today;
      const breeds = [...(lineage.get(sireId) ?? []), ...(lineage.get(damId) ?? [])];
      const pure = breeds.length > 0 && breeds.every((b) => b === breeds[0]) && breeds.length >= 2;
      const colour = pure ? pick(colours[breeds[0]!] ?? ['']) : pick(['Broken', 'White', 'Agouti', 'Chestnut', 'Black']);
      animals.push({
        id, farmId: farm(farmKey), breedingFarmId: farm(farmKey), tattoo: tattooFor(plan), name: keep || spec.names?.[k] ? (spec.names?.[k] ?? nameFor(farmKey)) : '',
        sex, breedId: null, colour, birthDate, sireId, damId, hutch: keep ? (spec.hutch ?? `G${counters.get(farmKey)}`) : 'Grow-out',
        lifecycle: ageDays < 56 ? 'kit' : keep && ageDays > 200 ? 'breeding' : 'junior',
        disposition: gone ? 'processed' : 'on_farm', dispositionOn: gone ? processedOn : undefined,
      });
      lineage.set(id, breeds);
      sexOf.set(id, sex);
      birthOf.set(id, birthDate);
      farmOf.set(id, farmKey);
      if (gone) goneOn.set(id, processedOn);
      born.push(id);
    }
    return born;
  };

  // The story line: Quillfeather's Bramwell sires Hazelrun's Willowmere's litter (they are half sibs by
  // Thornbury Ardent), so Clementine is inbred (COI 1/8) and her pedigree runs across three farms and papers.
  const [clementine] = litter('hazelrun', bramwell, willowmere, yearsAgo(2.2), { kits: 4, keep: 2, names: ['Clementine'], hutch: 'A4' });
  // Quillfeather raises a New Zealand buck by Bramwell out of Larkin and passes him to Saltbush.
  const quillNz = animals.filter((a) => a.farmId === farm('quillfeather') && a.name === 'Larkin')[0]!.id;
  const [tobinCandidate] = litter('quillfeather', bramwell, quillNz, yearsAgo(2.1), { kits: 3, keep: 1, hutch: 'S3' });
  const tobin = animals.find((a) => a.id === tobinCandidate)!;
  tobin.sex = 'buck';
  sexOf.set(tobin.id, 'buck');
  tobin.name = 'Tobin';
  tobin.farmId = farm('saltbush');
  tobin.transferredOn = addDays(tobin.birthDate!, 150);
  tobin.hutch = 'R5';
  tobin.lifecycle = 'breeding';
  farmOf.set(tobin.id, 'saltbush');
  // A Quillfeather New Zealand doe goes to Saltbush too, for its new line.
  const [juneDoe] = litter('quillfeather', bramwell, animals.find((a) => a.name === 'Opaline')!.id, yearsAgo(2.0), { kits: 3, keep: 1, names: ['June Bug'], hutch: 'R6' });
  const june = animals.find((a) => a.id === juneDoe)!;
  june.farmId = farm('saltbush');
  june.transferredOn = addDays(june.birthDate!, 140);
  june.lifecycle = 'breeding';
  farmOf.set(june.id, 'saltbush');
  void clementine;

  /** Breeders a farm keeps at `date`: alive then, old enough (8 months), of the sex asked. */
  const breedersAt = (farmKey: string | null, sex: Sex, date: string) =>
    animals.filter((a) =>
      a.farmId !== null && (farmKey === null || farmOf.get(a.id) === farmKey) && a.sex === sex &&
      a.birthDate! <= addDays(date, -240) && (goneOn.get(a.id) ?? '9999-12-31') > date && (!a.transferredOn || a.transferredOn <= date || farmKey === null),
    );
  const related = (x: string, y: string) => {
    const ax = animals.find((a) => a.id === x)!;
    const ay = animals.find((a) => a.id === y)!;
    return ax.sireId === y || ax.damId === y || ay.sireId === x || ay.damId === x || (ax.sireId !== null && ax.sireId === ay.sireId && ax.damId === ay.damId);
  };

  // A few departures with their causes, as any herd has.
  const culls: [string, string, 'culled' | 'died' | 'sold'][] = [
    ['Opaline', 'Missed three palpations in a row', 'culled'],
    ['Goldie', 'Heat stress in the July spell', 'died'],
    ['Auction Bess', 'Sold to a 4-H family outside the co-op', 'sold'],
  ];
  for (const [name, cause, disposition] of culls) {
    const animal = animals.find((a) => a.name === name && a.farmId !== null)!;
    animal.disposition = disposition;
    animal.dispositionCause = cause;
    animal.dispositionOn = yearsAgo(0.3);
    animal.lifecycle = 'retired';
    goneOn.set(animal.id, animal.dispositionOn);
  }

  // Three more seasons of litters on every farm, the last one still in the nest box.
  // The last two are still on the farm: a grow-out group near fryer age, and kits in the nest box.
  const seasons = [
    { ago: 1.6, kits: 3, keep: 1 }, { ago: 0.9, kits: 3, keep: 2 }, { ago: 0.45, kits: 3, keep: 2 },
    { ago: 0.16, kits: 4, keep: 1 }, { ago: 0.05, kits: 4, keep: 4 },
  ];
  for (const [s, season] of seasons.entries()) {
    for (const plan of plans) {
      const date = yearsAgo(season.ago, -plans.indexOf(plan) * 5);
      const does = breedersAt(plan.key, 'doe', date).slice(0, s === seasons.length - 1 ? 2 : 4);
      for (const doe of does) {
        const doeBreeds = lineage.get(doe.id) ?? [];
        const wanted = plan.cross && doeBreeds[0] === plan.cross[0] && random() < 0.5 ? plan.cross[1] : doeBreeds[0];
        // A buck of the wanted breed, unrelated to the doe: the farm's own, or (about a quarter of the time,
        // and whenever the farm has none) another farm's through the co-op's Stud Share.
        const fits = (b: ImportedAnimal) => !related(b.id, doe.id) && (!wanted || (lineage.get(b.id) ?? []).every((x) => x === wanted));
        const own = breedersAt(plan.key, 'buck', date).filter(fits);
        const elsewhere = breedersAt(null, 'buck', date).filter((b) => farmOf.get(b.id) !== plan.key && fits(b));
        const pool = (random() < 0.25 || own.length === 0) && elsewhere.length > 0 ? elsewhere : own;
        // With no fitting buck anywhere, the doe goes to the farm's own buck: a cross, as small farms make.
        const buck = pool.length ? pick(pool) : breedersAt(plan.key, 'buck', date).find((b) => !related(b.id, doe.id));
        if (!buck) continue;
        const born = addDays(date, Math.floor(random() * 10));
        // Crosses go to the freezer as fryers; breeders are kept from purebred litters.
        const breeds = new Set([...(lineage.get(buck.id) ?? []), ...doeBreeds]);
        const keep = (breeds.size === 1 && doeBreeds.length > 0) || s === seasons.length - 1 ? season.keep : 0;
        litter(plan.key, buck.id, doe.id, born > addDays(today, -7) ? addDays(today, -7) : born, { kits: season.kits, keep });
      }
    }
  }

  await importHerd(ctx.coopId, animals, null, tx);

  // Growth records: weigh-ins at 4, 8 and 11 weeks, then every two to three months while on the farm.
  const weighIns: ImportedWeighIn[] = [];
  const matureGrams = (id: string) => {
    const sex = sexOf.get(id)!;
    const grams = (lineage.get(id) ?? []).map((b) => {
      const standard = breed(b)[sex === 'buck' ? 'seniorBuckGrams' : 'seniorDoeGrams'];
      return ((standard.minGrams ?? 4000) + (standard.maxGrams ?? standard.minGrams ?? 4000)) / 2;
    });
    return grams.length ? grams.reduce((x, y) => x + y, 0) / grams.length : 4300;
  };
  for (const a of animals) {
    if (a.farmId === null || !a.birthDate) continue;
    const mature = matureGrams(a.id) * (0.94 + random() * 0.12);
    // Gompertz curve from about 60 g at birth; k chosen so a medium breed weighs ≈ 1.7 kg at 8 weeks
    // (compare Rao et al. 1977: 1,644 ± 359 g at 8 weeks).
    const b = Math.log(mature / 60);
    const weightAt = (day: number) => Math.round(mature * Math.exp(-b * Math.exp(-0.0262 * day)) * (0.96 + random() * 0.08));
    const until = goneOn.get(a.id) ?? today;
    const days = [28, 56, 77];
    for (let d = 120; addDays(a.birthDate, d) <= until; d += 75 + Math.floor(random() * 30)) days.push(d);
    for (const d of days) {
      const on = addDays(a.birthDate, d);
      if (on > until || on > today) break;
      const weighingFarm = a.transferredOn && on >= a.transferredOn ? a.farmId : (a.breedingFarmId ?? a.farmId);
      if (a.arrivedOn && on < a.arrivedOn) continue;
      const farmKey = [...ctx.farms.entries()].find(([, id]) => id === weighingFarm)![0];
      weighIns.push({ farmId: weighingFarm, animalId: a.id, totalGrams: weightAt(d), weighedOn: on, enteredBy: ctx.keepers.get(farmKey)!, reviewState: 'accepted' });
    }
  }
  // The Hazelrun apprentice's latest weigh-ins wait for the mentor's review.
  if (ctx.apprenticeId) {
    const hazelrunKits = animals.filter((a) => a.farmId === farm('hazelrun') && a.lifecycle !== 'breeding' && (a.disposition ?? 'on_farm') === 'on_farm').slice(0, 3);
    for (const kit of hazelrunKits) {
      weighIns.push({ farmId: farm('hazelrun'), animalId: kit.id, totalGrams: weightAt60(kit.birthDate!, today), weighedOn: today, enteredBy: ctx.apprenticeId, reviewState: 'pending' });
    }
  }
  await importWeighIns(ctx.coopId, weighIns, tx);
  return { animals: animals.length, weighIns: weighIns.length };
}

/** A plausible weight for a young New Zealand-sized rabbit of the given age (for the apprentice's entries). */
function weightAt60(birthDate: string, on: string): number {
  const day = (Date.parse(on) - Date.parse(birthDate)) / 86_400_000;
  return Math.max(80, Math.round(4800 * Math.exp(-Math.log(80) * Math.exp(-0.0262 * day))));
}

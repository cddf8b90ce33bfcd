import type { ChoreKind, SkillDefinition } from '../schemas/mentorship.schema';

/** The chore kinds a co-op starts with (the admin edits the list); the first few are the phone's quick picks. */
export const defaultChoreKinds: ChoreKind[] = [
  { key: 'feeding', label: 'Feeding' },
  { key: 'watering', label: 'Watering' },
  { key: 'cleaning', label: 'Cleaning' },
  { key: 'health-check', label: 'Health check' },
  { key: 'weighing', label: 'Weighing' },
  { key: 'handling', label: 'Handling' },
  { key: 'sexing-kits', label: 'Sexing kits' },
  { key: 'nest-box-check', label: 'Nest box check' },
  { key: 'palpation', label: 'Palpation' },
  { key: 'tattooing', label: 'Tattooing' },
  { key: 'weaning', label: 'Weaning' },
  { key: 'grooming', label: 'Grooming' },
  { key: 'processing-station', label: 'A processing-day station' },
];

/** The kinds whose entry carries a weight or a litter count (the form asks for it). */
export const weighingChoreKinds = ['weighing'] as const;
export const litterCountChoreKinds = ['weaning'] as const;

/** The co-op's starting checklist; what "signed off" means is common practice, for the co-op to edit. */
export const defaultSkills: SkillDefinition[] = [
  { key: 'handling', name: 'Handling and carrying', area: 'Care', dangerous: false, signedOffMeans: 'Lifts, carries and turns a rabbit with the hindquarters supported, calmly, without injury to rabbit or self.' },
  { key: 'sexing-kits', name: 'Sexing kits', area: 'Breeding', dangerous: false, signedOffMeans: 'Sexes a litter at weaning age correctly, checked by the mentor on the same kits.' },
  { key: 'nest-box', name: 'Nest box preparation', area: 'Breeding', dangerous: false, signedOffMeans: 'Prepares and places a clean, bedded nest box on the right day and checks the kits without disturbing the doe.' },
  { key: 'palpation', name: 'Palpation', area: 'Breeding', dangerous: false, signedOffMeans: 'Palpates a doe gently at 10–14 days and matches the later kindling result several times.' },
  { key: 'tattooing', name: 'Tattooing', area: 'Records', dangerous: false, signedOffMeans: 'Tattoos an ear clean and legibly with the rabbit safely restrained, and records it.' },
  { key: 'weighing', name: 'Weighing and recording', area: 'Records', dangerous: false, signedOffMeans: 'Weighs animals and groups accurately (tared scale, whole grams) and records them the same day.' },
  { key: 'illness-heat', name: 'Spotting illness and heat stress', area: 'Health', dangerous: false, signedOffMeans: 'Names the early signs of common illness and heat stress and tells the mentor at once.' },
  { key: 'medicines', name: 'Medicines and withdrawal', area: 'Health', dangerous: false, signedOffMeans: 'Gives a treatment as labelled or prescribed, records it, and keeps to its withdrawal period.' },
  { key: 'dispatch', name: 'Humane dispatch', area: 'Processing', dangerous: true, signedOffMeans: 'Dispatches quickly and humanely under supervision, as local rules and licensed practice require.' },
  { key: 'skinning', name: 'Skinning and evisceration', area: 'Processing', dangerous: true, signedOffMeans: 'Skins and eviscerates cleanly without contaminating the carcass, with sharp tools handled safely.' },
  { key: 'chilling', name: 'Chilling and food safety', area: 'Processing', dangerous: false, signedOffMeans: 'Chills carcasses promptly, keeps the cold chain and the work surfaces clean.' },
];

/** Shown beside every dangerous skill and station. */
export const dangerousSkillCaution =
  'Dangerous work: learn it under supervision only. Local rules and licensed practice govern dispatch and processing; follow them over anything here.';

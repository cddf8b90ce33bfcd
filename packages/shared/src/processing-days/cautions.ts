import type { CautionDto } from './processing-days-dto';

/**
 * The cautions every day page and day sheet shows. Figures name their publication; the rest is common
 * practice. Local codes and licensed practice come first.
 */
export const PROCESSING_DAY_CAUTIONS: ReadonlyArray<CautionDto> = [
  {
    id: 'knives',
    title: 'Knife and station safety',
    text: 'Cut away from yourself, keep knives sharp and in their place, wear cut-resistant gloves on the holding hand and keep stations clear of walkways.',
    source: 'common practice',
  },
  {
    id: 'dispatch',
    title: 'Humane dispatch',
    text: 'Only trained hands dispatch. Stun or dispatch with one quick, certain action and check the animal is insensible before bleeding.',
    source: 'common practice; see the AVMA Guidelines for the Humane Slaughter of Animals (2016)',
  },
  {
    id: 'tularemia',
    title: 'Gloves when dressing (tularemia)',
    text: 'Wear gloves when skinning and dressing; rabbits can carry tularemia. Set aside any carcass with white spots on the liver and wash hands after.',
    source: 'CDC, Tularemia: Prevention (wear gloves when handling animals, especially rabbits)',
  },
  {
    id: 'chill',
    title: 'Chill promptly to 40 °F / 4.4 °C or below',
    text: 'Move carcasses into ice water or the cooler as soon as they are dressed and bring them to 40 °F (4.4 °C) or below.',
    source: 'USDA FSIS, Rabbit from Farm to Table (keep at 40 °F or below)',
  },
  {
    id: 'cooking',
    title: 'Cook rabbit to 160 °F / 71 °C',
    text: 'Tell buyers and members to cook rabbit to an internal 160 °F (71 °C).',
    source: 'USDA FSIS, Rabbit from Farm to Table (cook to 160 °F)',
  },
  {
    id: 'selling',
    title: 'Check state and local rules before selling meat',
    text: 'Rules for selling rabbit meat differ by state and county (exemptions, licensed facilities, labels). This day is for the members\u2019 own use unless the site is licensed; local codes and licensed practice come first.',
    source: 'common practice; your state department of agriculture',
  },
];

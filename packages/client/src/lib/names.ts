/** How an animal is named everywhere: "Clover (C12)", or whichever of name and tattoo it has. */
export function animalName(a: { name: string; tattoo: string | null }): string {
  if (a.name && a.tattoo) return `${a.name} (${a.tattoo})`;
  return a.name || a.tattoo || 'Unnamed';
}

/** What a treatment, withdrawal or processing record is about: an animal or a grow-out group. */
export function subjectName(w: { animal: { name: string; tattoo: string | null } | null; group: { name: string } | null }): string {
  if (w.animal) return animalName(w.animal);
  return w.group ? `Group ${w.group.name}` : 'Unknown';
}

import { Alert } from '../../../components/ui/alert';

/** The medicines caution (brief, "Where the work can hurt"; Sundlof et al., JAVMA 1991; FARAD). */
export function MedicineCaution() {
  return (
    <Alert tone="warning" title="Treatment is a veterinarian's call">
      No drugs are approved for rabbits in the US: every treatment is extralabel and needs a veterinarian, who sets the withdrawal time before
      slaughter. Record the withdrawal exactly as the veterinarian set it, and defer to licensed practice.
    </Alert>
  );
}

import { Alert } from '../../../components/ui/alert';

/** The processing-day and selling cautions (brief, "Where the work can hurt"; USDA FSIS; CDC tularemia guidance). */
export function ProcessingCautions() {
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <Alert tone="warning" title="Safe processing">
        <ul className="list-disc space-y-1 pl-5">
          <li>Sharp knives, a steady station with room to work, and no one at your elbow; cut away from yourself.</li>
          <li>Dispatch humanely: quick, certain, by someone who has been shown how.</li>
          <li>Wear gloves when dressing (tularemia); discard any carcass with spotted liver or signs of illness.</li>
          <li>Chill carcasses promptly to 40 °F / 4.4 °C or below; cook rabbit to 160 °F / 71 °C inside.</li>
        </ul>
      </Alert>
      <Alert tone="info" title="Selling meat">
        Federal inspection of rabbit is voluntary in the US and state rules differ. Check your state and local rules before selling any meat, and defer
        to them over anything here.
      </Alert>
    </div>
  );
}

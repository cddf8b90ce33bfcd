import { useId, useRef, useState } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { ProgressBar } from '../../../components/ui/progress-bar';
import { useFarmPhoto, useRemoveFarmPhoto, useReplaceFarmPhoto } from '../api/farm-photo';
import { photoChoiceProblem } from './photo-gallery';

/** The farm profile's one photo: everyone in the co-op sees it, the farm's members change it. */
export function FarmPhoto({ farmId, farmName }: { farmId: string; farmName: string }) {
  const photo = useFarmPhoto(farmId);
  const replace = useReplaceFarmPhoto(farmId);
  const remove = useRemoveFarmPhoto(farmId);
  const [progress, setProgress] = useState<number | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const input = useRef<HTMLInputElement>(null);
  const inputId = useId();
  if (!photo.data || (!photo.data.photo && !photo.data.canChange)) return null;
  const { photo: current, canChange, limits } = photo.data;

  const send = (file: File | undefined) => {
    if (!file) return;
    const wrong = photoChoiceProblem([file], limits, 0);
    setProblem(wrong);
    if (wrong) return;
    setProgress(0);
    replace.mutate(
      { file, onUpload: (sent, total) => setProgress(total > 0 ? sent / total : null) },
      {
        onSettled: () => {
          setProgress(null);
          if (input.current) input.current.value = '';
        },
      },
    );
  };

  return (
    <Card className="space-y-3 self-start">
      <h2 className="text-lg font-semibold">Farm photo</h2>
      {current ? (
        <img src={current.url} alt={current.caption || `${farmName}`} className="max-h-72 w-full rounded-xl object-cover" />
      ) : (
        <p className="text-grey-600">No photo yet.</p>
      )}
      {canChange && (
        <div className="space-y-3">
          <label htmlFor={inputId} className="block font-semibold text-bark">
            {current ? 'Replace the photo' : 'Add a photo'}
          </label>
          <input
            ref={input}
            id={inputId}
            type="file"
            accept={limits.types.join(',')}
            disabled={replace.isPending}
            onChange={(e) => send(e.target.files?.[0])}
            className="block min-h-11 w-full rounded-lg border-2 border-grey-300 bg-white p-2 file:mr-3 file:min-h-9 file:rounded-md file:border-0 file:bg-moss file:px-3 file:font-semibold file:text-white"
          />
          {current && (
            <Button variant="quiet" className="-ml-2" isBusy={remove.isPending} onClick={() => remove.mutate()}>
              Remove the photo
            </Button>
          )}
          {progress !== null && <ProgressBar label="Uploading photo" value={progress} />}
          {problem && <Alert tone="error">{problem}</Alert>}
          {replace.isError && <Alert tone="error">{replace.error.message}</Alert>}
        </div>
      )}
    </Card>
  );
}

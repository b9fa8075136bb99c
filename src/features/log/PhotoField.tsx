// Photos of the entry: picked from files or taken with the camera, stored as blobs through
// the store at once (so a crash keeps them), listed with a thumbnail and removable.
import { useLiveQuery } from 'dexie-react-hooks';
import { useEffect, useState } from 'react';
import { attachPhoto, getPhoto, listPhotos, removePhoto } from '../../db';
import { useObservationForm } from '../../state/observationForm';

function Thumb({ id, name }: { id: string; name: string }) {
  const [url, setUrl] = useState<string | null>(null);
  useEffect(() => {
    let made: string | null = null;
    let cancelled = false;
    void getPhoto(id).then((p) => {
      if (cancelled || !p) return;
      made = URL.createObjectURL(p.blob);
      setUrl(made);
    });
    return () => {
      cancelled = true;
      if (made) URL.revokeObjectURL(made);
    };
  }, [id]);
  return url ? <img src={url} alt={name} className="photo-thumb" /> : <span className="photo-thumb placeholder">{name}</span>;
}

export function PhotoField({ cruiseId }: { cruiseId: string }) {
  const observationId = useObservationForm((s) => s.draft.id);
  const photoIds = useObservationForm((s) => s.draft.photoIds);
  const setField = useObservationForm((s) => s.setField);
  const stored = useLiveQuery(() => listPhotos(observationId), [observationId], []);
  const [message, setMessage] = useState<string | null>(null);
  const shown = stored.filter((p) => photoIds.includes(p.id));

  const add = async (files: FileList | null) => {
    if (!files || files.length === 0) return;
    setMessage(null);
    const ids = [...useObservationForm.getState().draft.photoIds];
    for (const f of Array.from(files)) {
      try {
        const meta = await attachPhoto({
          observationId, cruiseId, blob: f, fileName: f.name,
          ...(f.lastModified ? { takenAt: new Date(f.lastModified).toISOString().replace(/\.\d{3}Z$/, 'Z') } : {}),
        });
        ids.push(meta.id);
      } catch (err) {
        setMessage(`Photo "${f.name}" not stored: ${err instanceof Error ? err.message : String(err)}`);
      }
    }
    setField('photoIds', ids);
  };

  const remove = async (id: string) => {
    setField('photoIds', useObservationForm.getState().draft.photoIds.filter((p) => p !== id));
    // The bytes go only when no saved version refers to them (the store decides).
    await removePhoto(id).catch(() => undefined);
  };

  return (
    <div className="field photo-field">
      <label htmlFor="f-photos">Photos</label>
      <input id="f-photos" type="file" accept="image/*" capture="environment" multiple onChange={(e) => void add(e.currentTarget.files)} />
      {message && <p className="finding finding-error" role="alert">{message}</p>}
      {shown.length > 0 && (
        <ul className="photo-list">
          {shown.map((p) => (
            <li key={p.id}>
              <Thumb id={p.id} name={p.fileName} />
              <button type="button" className="button small" tabIndex={-1} onClick={() => void remove(p.id)} aria-label={`Remove photo ${p.fileName}`}>
                Remove
              </button>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}

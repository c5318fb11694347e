/**
 * Datasheets of a part: download links for everyone; librarians drop a PDF (with upload progress) or remove one.
 * When the server finds the file's text does not fit the part (its number missing, another kind of part named,
 * no text at all) it answers 409 with a question: shown here with "Attach anyway" (sends it again with
 * confirm=true) and "Choose another file"; focus moves to the question, Escape dismisses it.
 */
import { useCallback, useEffect, useRef, useState } from 'react';
import { bytes } from '../../lib/units.ts';
import { useDropzone } from 'react-dropzone';
import type { DatasheetView } from '../../lib/schemas/parts.ts';
import { sendJson } from './api.ts';

interface Props {
  partId: number;
  initial: DatasheetView[];
  canManage: boolean;
}

type Upload =
  | { state: 'idle' }
  | { state: 'sending'; name: string; percent: number }
  | { state: 'done'; name: string; confirmed?: boolean }
  | { state: 'confirm'; file: File; message: string; reasons: string[] }
  | { state: 'error'; message: string };

const MAX_BYTES = 20 * 1024 * 1024;
const size = (b: number): string => bytes(b);

/** A datasheet record, or the error shape. */
type UploadAnswer =
  | (Partial<DatasheetView> & {
      error?: string;
      issues?: { path: string; message: string }[];
      confirmation?: { needed: boolean; field: string };
    })
  | null;

function uploadWithProgress(
  url: string,
  form: FormData,
  onProgress: (percent: number) => void,
): Promise<{ status: number; body: UploadAnswer }> {
  return new Promise((resolve) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', url);
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(Math.round((e.loaded / e.total) * 100));
    xhr.onload = () => {
      let body: UploadAnswer = null;
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        body = null;
      }
      resolve({ status: xhr.status, body });
    };
    xhr.onerror = () => resolve({ status: 0, body: { error: 'The upload was interrupted. Check the connection and try again.' } });
    xhr.send(form);
  });
}

export default function DatasheetPanel({ partId, initial, canManage }: Props) {
  const [sheets, setSheets] = useState(initial);
  const [upload, setUpload] = useState<Upload>({ state: 'idle' });
  const [revision, setRevision] = useState('');
  const [removeError, setRemoveError] = useState('');

  const question = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (upload.state === 'confirm') question.current?.focus();
  }, [upload.state]);

  const send = useCallback(
    async (file: File, confirm: boolean) => {
      const form = new FormData();
      form.append('revision', revision);
      if (confirm) form.append('confirm', 'true');
      form.append('file', file, file.name);
      setUpload({ state: 'sending', name: file.name, percent: 0 });
      const res = await uploadWithProgress(`/api/parts/${partId}/datasheets`, form, (percent) =>
        setUpload({ state: 'sending', name: file.name, percent }),
      );
      if (res.status === 201) {
        setSheets((list) => [res.body as DatasheetView, ...list]);
        setUpload({ state: 'done', name: file.name, confirmed: confirm });
        setRevision('');
      } else if (res.status === 409 && res.body?.confirmation?.needed) {
        setUpload({
          state: 'confirm',
          file,
          message: res.body.error ?? 'This file may not be the datasheet of this part.',
          reasons: (res.body.issues ?? []).map((i) => i.message),
        });
      } else {
        const detail = res.body?.issues?.[0]?.message;
        setUpload({ state: 'error', message: `${res.body?.error ?? `The server answered ${res.status}.`}${detail ? ` (${detail})` : ''}` });
      }
    },
    [partId, revision],
  );

  const onDrop = useCallback(
    async (accepted: File[], rejected: { file: File; errors: readonly { message: string }[] }[]) => {
      if (rejected.length > 0) {
        setUpload({ state: 'error', message: `${rejected[0].file.name}: ${rejected[0].errors.map((e) => e.message).join('; ')}` });
        return;
      }
      const file = accepted[0];
      if (file) await send(file, false);
    },
    [send],
  );

  const { getRootProps, getInputProps, isDragActive } = useDropzone({
    onDrop,
    multiple: false,
    maxSize: MAX_BYTES,
    accept: { 'application/pdf': ['.pdf'] },
    disabled: upload.state === 'sending' || upload.state === 'confirm',
  });

  // react-dropzone hides its input with an inline style, which the Content-Security-Policy refuses; a class does it instead.
  const { style: _inlineStyle, ...inputProps } = getInputProps();

  async function remove(sheet: DatasheetView): Promise<void> {
    if (!window.confirm(`Remove ${sheet.originalName}? The file is deleted.`)) return;
    const res = await sendJson<void>('DELETE', `/api/datasheets/${sheet.id}`);
    if (res.ok) setSheets((list) => list.filter((s) => s.id !== sheet.id));
    else setRemoveError(res.error);
  }

  return (
    <div data-testid="datasheets">
      {sheets.length === 0 ? (
        <p className="text-sm text-ink-soft mb-2">No datasheet attached yet.</p>
      ) : (
        <ul className="grid gap-1 mb-2 text-sm">
          {sheets.map((s) => (
            <li key={s.id} className="flex flex-wrap items-baseline gap-x-3" data-testid="datasheet-row">
              <a href={`/api/datasheets/${s.id}`} download={s.originalName} className="font-semibold">
                <span aria-hidden="true">⤓ </span>
                {s.originalName}
              </a>
              <span className="text-ink-soft">
                {s.revision ? `rev. ${s.revision} · ` : ''}
                {s.pages} page{s.pages === 1 ? '' : 's'} · {size(s.bytes)}
              </span>
              <span className="text-ink-faint text-xs" title={`SHA-256 ${s.sha256}`}>
                added {s.uploadedAt.slice(0, 10)}
                {s.uploadedBy ? ` by ${s.uploadedBy}` : ''}
              </span>
              {canManage && (
                <button type="button" className="text-bad text-xs underline cursor-pointer" onClick={() => remove(s)}>
                  Remove
                </button>
              )}
            </li>
          ))}
        </ul>
      )}
      {removeError && (
        <p role="alert" className="field-error">
          <span aria-hidden="true">✕ </span>
          {removeError}
        </p>
      )}
      {canManage && (
        <div className="grid gap-2">
          <label className="field max-w-xs">
            Revision label (optional)
            <input
              value={revision}
              onChange={(e) => setRevision(e.target.value)}
              maxLength={40}
              placeholder="e.g. Rev. C, 2026-03"
              name="revision"
            />
          </label>
          <div
            {...getRootProps({
              className: `border-2 border-dashed rounded p-4 text-sm text-center cursor-pointer ${isDragActive ? 'border-copper bg-copper-wash' : 'border-rule'}`,
            })}
            data-testid="datasheet-drop"
          >
            <input {...inputProps} className="hidden" data-testid="datasheet-input" />
            <span aria-hidden="true">⇪ </span>Drop a PDF datasheet here, or press to choose one (at most 20 MB).
          </div>
          <div aria-live="polite" className="text-sm">
            {upload.state === 'sending' && (
              <span className="flex items-center gap-2">
                <progress max={100} value={upload.percent} aria-label={`Uploading ${upload.name}`} /> {upload.percent} % of {upload.name}
              </span>
            )}
            {upload.state === 'done' && (
              <span className="text-ok" data-testid="upload-done">
                <span aria-hidden="true">✓ </span>
                {upload.name} attached{upload.confirmed ? ' (confirmed by you; the part history records it)' : ''}.
              </span>
            )}
            {upload.state === 'confirm' && (
              <div
                ref={question}
                tabIndex={-1}
                role="group"
                aria-labelledby="datasheet-question-title"
                aria-describedby="datasheet-question-reasons"
                className="border-2 border-warn rounded p-3 grid gap-2 bg-warn-wash text-ink"
                data-testid="datasheet-question"
                onKeyDown={(e) => {
                  if (e.key === 'Escape') setUpload({ state: 'idle' });
                }}
              >
                <p id="datasheet-question-title" className="font-semibold">
                  <span aria-hidden="true">⚠ </span>Is {upload.file.name} the datasheet of this part?
                </p>
                {upload.reasons.length === 0 ? (
                  <p id="datasheet-question-reasons">{upload.message}</p>
                ) : (
                  <>
                    <ul id="datasheet-question-reasons" className="list-disc pl-5">
                      {upload.reasons.map((r) => (
                        <li key={r}>{r}</li>
                      ))}
                    </ul>
                    <p>
                      Check the file; attach it anyway only if it is this part&apos;s datasheet. The part history will say you confirmed it.
                    </p>
                  </>
                )}
                <div className="flex flex-wrap gap-2">
                  <button type="button" className="btn" onClick={() => void send(upload.file, true)}>
                    Attach anyway
                  </button>
                  <button type="button" className="btn btn-quiet" onClick={() => setUpload({ state: 'idle' })}>
                    Choose another file
                  </button>
                </div>
              </div>
            )}
            {upload.state === 'error' && (
              <span className="text-bad" role="alert" data-testid="upload-error">
                <span aria-hidden="true">✕ </span>
                {upload.message}
              </span>
            )}
          </div>
        </div>
      )}
    </div>
  );
}

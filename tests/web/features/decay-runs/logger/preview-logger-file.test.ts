import { afterEach, describe, expect, it, vi } from 'vitest';
import { ApiError } from '../../../../../web/src/lib/api-client';
import { columnCandidatesOf, previewLoggerFile } from '../../../../../web/src/features/decay-runs/api/preview-logger-file';

/** A stand-in for XMLHttpRequest that records what is sent and answers `status` with `body`. */
function answerUploads(status: number, body: unknown) {
  const sent: { method: string; path: string; form: FormData }[] = [];
  class FakeXhr {
    status = 0;
    responseText = '';
    withCredentials = false;
    upload: { onprogress: ((e: { lengthComputable: boolean; loaded: number; total: number }) => void) | null } = { onprogress: null };
    onload: (() => void) | null = null;
    onerror: (() => void) | null = null;
    private method = '';
    private path = '';
    open(method: string, path: string) {
      this.method = method;
      this.path = path;
    }
    setRequestHeader() {}
    send(form: FormData) {
      sent.push({ method: this.method, path: this.path, form });
      this.upload.onprogress?.({ lengthComputable: true, loaded: 5, total: 10 });
      this.status = status;
      this.responseText = JSON.stringify(body);
      this.onload?.();
    }
  }
  vi.stubGlobal('XMLHttpRequest', FakeXhr);
  return sent;
}

const file = () => new File(['Time (s);CH1 (V);CH2 (V)\n0;565;12\n'], 'scope.csv', { type: 'text/csv' });

describe('previewLoggerFile', () => {
  afterEach(() => vi.unstubAllGlobals());

  it('when columns are chosen, then they go with the file (the file last) to the preview, and progress is reported', async () => {
    const sent = answerUploads(200, { fileName: 'scope.csv', samples: [] });
    const progress: number[] = [];
    const preview = await previewLoggerFile({ file: file(), timeColumn: '1', voltsColumn: '2', onProgress: (f) => progress.push(f) });
    expect(preview.fileName).toBe('scope.csv');
    expect(sent[0]!.method).toBe('POST');
    expect(sent[0]!.path).toBe('/api/logger-files/preview');
    expect([...sent[0]!.form.keys()]).toEqual(['timeColumn', 'voltsColumn', 'file']);
    expect(progress).toEqual([0.5, 1]);
  });

  it('when the server asks for the columns, then the refusal carries the candidates', async () => {
    const candidates = { question: 'voltsColumn', headerRow: 1, columns: ['Time (s)', 'CH1 (V)', 'CH2 (V)'], rows: [['0', '565', '12']] };
    answerUploads(422, { error: { code: 'columns-ambiguous', message: 'Row 1 (the header, semicolon separated): 2 columns could be the voltage', issues: [{ path: 'voltsColumn', message: 'x' }], candidates } });
    const error = await previewLoggerFile({ file: file() }).catch((err: unknown) => err);
    expect(error).toBeInstanceOf(ApiError);
    expect((error as ApiError).status).toBe(422);
    expect((error as ApiError).issues).toEqual([{ path: 'voltsColumn', message: 'x' }]);
    expect(columnCandidatesOf(error)).toEqual(candidates);
  });

  it('when the file is refused for another reason, then there are no candidates', async () => {
    answerUploads(415, { error: { code: 'not-a-text-file', message: '"scope.csv" is a PNG image, not a text file.' } });
    const error = await previewLoggerFile({ file: file() }).catch((err: unknown) => err);
    expect((error as ApiError).code).toBe('not-a-text-file');
    expect(columnCandidatesOf(error)).toBeNull();
    expect(columnCandidatesOf(new Error('x'))).toBeNull();
  });
});

import { useDropzone, type FileRejection } from 'react-dropzone';
import { Button } from '../../../components/ui/button';
import type { Reading } from '../hooks/use-recording-reader';
import { ProgressBar } from '../../../components/ui/progress-bar';

const EXTENSIONS = ['.wav', '.csv', '.tsv', '.txt', '.mat', '.h5', '.hdf5', '.uff', '.unv'];

// For the file picker's filter; the extension check below is what decides.
const accept = {
  'audio/wav': ['.wav'],
  'text/csv': ['.csv'],
  'text/tab-separated-values': ['.tsv'],
  'text/plain': ['.txt'],
  'application/octet-stream': ['.mat', '.h5', '.hdf5', '.uff', '.unv'],
};

const hasKnownExtension = (name: string) => EXTENSIONS.some((ext) => name.toLowerCase().endsWith(ext));

function rejectionMessage(rejections: FileRejection[]): string {
  if (rejections.length > 1 || rejections.some((r) => r.errors.some((e) => e.code === 'too-many-files'))) {
    return 'Drop one file at a time.';
  }
  return `Fanlight reads .wav, .csv, .tsv, .txt, .mat, .h5, .hdf5, .uff and .unv files; ${rejections[0].file.name} is none of these.`;
}

interface DropZoneProps {
  reading: Reading | null;
  onFile: (file: File) => void;
  onRejected: (message: string) => void;
  onCancel: () => void;
  /** Smaller, once a recording is open */
  compact?: boolean;
}

export function DropZone({ reading, onFile, onRejected, onCancel, compact = false }: DropZoneProps) {
  const { getRootProps, getInputProps, isDragActive } = useDropzone({
    accept,
    multiple: false,
    disabled: reading !== null,
    validator: (file) =>
      hasKnownExtension(file.name) ? null : { code: 'file-invalid-type', message: 'Not a recording Fanlight reads.' },
    onDrop: (accepted, rejected) => {
      if (rejected.length > 0 || accepted.length !== 1) {
        if (rejected.length > 0) onRejected(rejectionMessage(rejected));
        return;
      }
      onFile(accepted[0]);
    },
  });

  if (reading) {
    const percent = Math.round(Math.min(1, Math.max(0, reading.fraction)) * 100);
    return (
      <div className="flex flex-col gap-3 rounded-lg border border-ink-700 bg-ink-850 p-4" data-testid="drop-zone">
        <p className="break-all text-sm text-mist-300">
          Reading <span className="text-mist-100">{reading.fileName}</span>…
        </p>
        <ProgressBar label={`Reading ${reading.fileName}`} percent={percent} className="h-2" />
        <div className="flex items-center justify-between">
          <span className="font-mono text-xs text-mist-500">{percent} %</span>
          <Button type="button" variant="quiet" className="px-2.5 py-1" onClick={onCancel}>
            Cancel
          </Button>
        </div>
      </div>
    );
  }

  return (
    <div
      {...getRootProps({
        'data-testid': 'drop-zone',
        className: `flex cursor-pointer flex-col items-center gap-1.5 rounded-lg border-2 border-dashed px-4 text-center transition-colors ${compact ? 'py-3' : 'py-8'} ${
          isDragActive ? 'border-accent bg-ink-850' : 'border-ink-700 bg-ink-900 hover:border-ink-600'
        }`,
      })}
    >
      <input {...getInputProps({ 'aria-label': 'Recording file' })} data-testid="drop-zone-input" />
      <p className="text-sm font-medium text-mist-100">{isDragActive ? 'Let go to read it' : 'Drop a recording here'}</p>
      <p className="text-xs text-mist-500">or click to pick one · WAV, or CSV/TSV/TXT with one column per channel</p>
    </div>
  );
}

import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import type { RatePrompt } from '../hooks/use-recording-reader';

const sampleRateForm = z.object({
  sampleRateHz: z.coerce
    .number({ error: 'Enter the sample rate in Hz.' })
    .positive({ error: 'The sample rate must be above 0 Hz.' })
    .max(10_000_000, { error: 'At most 10000000 Hz.' }),
});

type Input = z.input<typeof sampleRateForm>;
type Output = z.output<typeof sampleRateForm>;

/** Asked when a CSV has no time column: the rows are then taken as evenly spaced at this rate. */
export function SampleRateForm({
  prompt,
  onSubmit,
  onCancel,
}: {
  prompt: RatePrompt;
  onSubmit: (sampleRateHz: number) => void;
  onCancel: () => void;
}) {
  const form = useForm<Input, unknown, Output>({
    resolver: zodResolver(sampleRateForm),
    defaultValues: { sampleRateHz: '' },
  });
  const { errors } = form.formState;
  return (
    <form
      onSubmit={form.handleSubmit((v) => onSubmit(v.sampleRateHz))}
      noValidate
      className="flex flex-col gap-3 rounded-lg border border-ink-700 bg-ink-850 p-4"
      aria-labelledby="sample-rate-heading"
    >
      <h3 id="sample-rate-heading" className="text-sm font-medium text-mist-100">
        Sample rate of <span className="break-all">{prompt.fileName}</span>
      </h3>
      <p className="text-sm text-mist-300">{prompt.message}</p>
      <TextField
        label="Sample rate (Hz)"
        inputMode="decimal"
        autoFocus
        className="font-mono"
        error={errors.sampleRateHz?.message}
        {...form.register('sampleRateHz')}
      />
      <div className="flex gap-2">
        <Button type="submit">Read with this rate</Button>
        <Button type="button" variant="quiet" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

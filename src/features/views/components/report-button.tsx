import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import type { RegisteredRecording } from '../../../../server/schemas/recordings';
import type { Mark, ViewDetail } from '../../../../server/schemas/views';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { errorMessage } from '../../../lib/error-message';
import { markThreadQuery } from '../api/marks';
import type { DecodedSnapshot } from '../api/snapshot';
import { mapPng, reportFonts } from '../report/report-assets';
import { buildViewReport } from '../report/report-pdf';

interface ReportButtonProps {
  view: ViewDetail;
  projectName: string;
  recording: RegisteredRecording | null;
  snapshot: DecodedSnapshot | undefined;
  marks: Mark[] | undefined;
  me: string;
}

/** Builds the view's PDF report in the browser and hands it over as a download. */
export function ReportButton({ view, projectName, recording, snapshot, marks, me }: ReportButtonProps) {
  const qc = useQueryClient();
  const [busy, setBusy] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);
  const ready = marks !== undefined && (view.snapshot === null || snapshot !== undefined);

  const make = async () => {
    setBusy(true);
    setProblem(null);
    try {
      const withReplies = await Promise.all(
        (marks ?? []).map(async (mark) => ({ mark, replies: await qc.fetchQuery(markThreadQuery(view.id, mark.id)) })),
      );
      const bytes = await buildViewReport({
        view,
        projectName,
        recording,
        header: snapshot?.header ?? null,
        mapPng: snapshot ? await mapPng(snapshot, view.state.colourRange.scale) : null,
        marks: withReplies,
        generatedAt: new Date(),
        generatedBy: me,
        fonts: await reportFonts(),
      });
      const url = URL.createObjectURL(new Blob([bytes.slice()], { type: 'application/pdf' }));
      const a = document.createElement('a');
      a.href = url;
      a.download = `fanlight-view-${view.id}.pdf`;
      a.click();
      setTimeout(() => URL.revokeObjectURL(url), 10_000);
    } catch (e) {
      setProblem(errorMessage(e));
    } finally {
      setBusy(false);
    }
  };

  return (
    <div className="flex flex-col gap-2">
      <Button type="button" variant="quiet" disabled={!ready || busy} onClick={() => void make()}>
        {busy ? 'Making the report…' : 'Report (PDF)'}
      </Button>
      {problem && <Notice tone="error">{problem}</Notice>}
    </div>
  );
}

import { useState } from 'react';
import type { Mark, ViewDetail } from '../../../../server/schemas/views';
import { useCreateMark } from '../api/marks';
import { useViewPage } from '../hooks/use-view-page';
import type { AxisSpec } from '../snapshot/axes';
import { EditableMarkBody } from './mark-editor';
import { MarkThread, ViewThread } from './member-threads';
import { PlaceMarkForm } from './place-mark-form';
import type { PendingPlace } from './snapshot-figure';
import { ViewLayout } from './view-layout';
import { ViewAside } from './view-aside';
import { ViewPageHeading } from './view-page-heading';

/** A view as its project's members see it: heading, snapshot with guides and marks, threads, sharing, report. */
export function LoadedView({ view }: { view: ViewDetail }) {
  const page = useViewPage(view);
  const { project, isLead, isEngineer, open, snapshot, marks, selectMark } = page;
  const [pending, setPending] = useState<PendingPlace | null>(null);
  const create = useCreateMark(view.id);
  const place = async (text: string) => {
    if (!pending) return;
    const mark: Mark = await create.mutateAsync({ ...pending, text });
    setPending(null);
    selectMark(mark.id);
  };
  const axes = (snapshot.data?.header.axes ?? view.state.axes) as { x: AxisSpec; y: AxisSpec };

  return (
    <ViewLayout
      heading={<ViewPageHeading view={view} projectName={project.data?.name ?? null} isLead={isLead} />}
      state={view.state}
      snapshot={{ hasSnapshot: view.snapshot !== null, data: snapshot.data, isPending: snapshot.isPending, error: snapshot.error }}
      marks={marks.data}
      marksError={marks.error}
      selectedMarkId={page.selectedMarkId}
      onSelectMark={selectMark}
      markParts={(m, n, selected) => ({
        body: page.mayEdit(m) ? <EditableMarkBody viewId={view.id} mark={m} number={n} /> : undefined,
        thread: <MarkThread viewId={view.id} markId={m.id} mayReply={open} open={selected} onOpen={() => selectMark(m.id)} />,
      })}
      discussion={<ViewThread viewId={view.id} mayReply={open} />}
      placing={
        isEngineer && open
          ? {
              pending,
              onPick: setPending,
              form: <PlaceMarkForm pending={pending} axes={axes} onClear={() => setPending(null)} onPlace={place} />,
            }
          : undefined
      }
      aside={<ViewAside view={view} page={page} />}
    />
  );
}

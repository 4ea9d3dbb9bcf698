import type { Trace } from '$lib/domain';
import { analysePendulumTrace, pendulumInputFromTrace, type PendulumAnalysis } from '$lib/pendulum';
import { describeError, session, INSTRUMENT_MESSAGES as m } from '$lib/ui';

/** Reads one saved pendulum trace of this patient and analyses its samples again; an error in words otherwise. */
export async function loadSavedSwing(patientId: string, traceId: string, formatDate: (iso: string) => string): Promise<{ analysis: PendulumAnalysis; startedAt: string } | { error: string }> {
  try {
    const store = await session.open();
    const trace = (await store.traces.get(traceId)) as Trace | undefined;
    if (!trace || trace.deleted || trace.patientId !== patientId) return { error: m.noSuchSwing };
    const label = m.swingLabel(formatDate(trace.startedAt));
    return { analysis: analysePendulumTrace(pendulumInputFromTrace(trace, label), { fileName: label }), startedAt: trace.startedAt };
  } catch (e) {
    return { error: m.swingUnreadable(describeError(e)) };
  }
}

import { useState } from 'react';
import { go } from '../app/route.ts';
import { useServices } from '../app/services.ts';
import { useDraft } from '../app/use-draft.ts';
import { useLive } from '../app/use-live.ts';
import { saving } from '../app/write-failure.ts';
import { experimentRecordIds } from '../bench/delete.ts';
import { installDemo } from '../demo/install-demo.ts';
import { labAccuracy } from '../review/lab-accuracy.ts';
import { AccuracyCard } from './AccuracyCard.tsx';
import { ConfirmButton } from './ConfirmButton.tsx';
import { NewExperimentForm } from './NewExperimentForm.tsx';
import { StorageCard } from './StorageCard.tsx';
import { SyncCard } from './SyncCard.tsx';
import { TopBar } from './TopBar.tsx';
import { UnreadableCard } from './UnreadableCard.tsx';

export function HomeScreen() {
  const services = useServices();
  const experiments = useLive((s) => s.store.all('experiments'), []);
  const accuracy = useLive((s) => labAccuracy(s.store), []);
  const [demoStep, setDemoStep] = useState<string | null>(null);
  const [demoError, setDemoError] = useState<string | null>(null);
  const [creating, setCreating] = useDraft('new-experiment-open', () => false);

  const list = experiments.state === 'ready' ? experiments.value : [];
  const demo = list.find((e) => e.demo);

  async function openDemo() {
    if (demo) return go({ screen: 'experiment', id: demo.id, tab: 'assays' });
    setDemoError(null);
    try {
      const id = await installDemo(services.store, services.worker, setDemoStep);
      go({ screen: 'experiment', id, tab: 'assays' });
    } catch (e) {
      setDemoError(`The demo could not be set up: ${e instanceof Error ? e.message : String(e)}`);
    } finally {
      setDemoStep(null);
    }
  }

  return (
    <>
      <TopBar title="Rivalplate" />
      <main>
        <section className="card">
          <h2>Try it on demo plates</h2>
          <p className="muted">
            The Marrowfield pond project: six evolved lines against their blue-marked ancestor, with
            real-looking plate photos. Demo data, kept apart from your own.
          </p>
          <button
            type="button"
            className="btn primary"
            onClick={openDemo}
            disabled={demoStep !== null}
          >
            {demo ? 'Open the demo' : 'Set up the demo'}
          </button>
          {demo && (
            <ConfirmButton
              label="Remove the demo"
              armed="Tap again to remove the demo"
              disabled={demoStep !== null}
              onConfirm={() =>
                saving('the removal of the demo', () =>
                  experimentRecordIds(services.store, demo.id).then((ids) =>
                    services.store.remove(ids),
                  ),
                )
              }
            />
          )}
          {demoStep && (
            <p className="muted" role="status">
              {demoStep}
            </p>
          )}
          {demoError && <p className="field-error">{demoError}</p>}
        </section>

        <section className="card">
          <div className="row spread">
            <h2>Experiments</h2>
            {!creating && (
              <button type="button" className="btn" onClick={() => setCreating(true)}>
                New experiment
              </button>
            )}
          </div>
          {creating && (
            <NewExperimentForm
              onDone={(id) => {
                setCreating(false);
                if (id) go({ screen: 'experiment', id, tab: 'assays' });
              }}
            />
          )}
          {!list.some((e) => !e.demo) && !creating && (
            <p className="muted">No experiments of your own on this device yet.</p>
          )}
          <ul className="plates" style={{ listStyle: 'none', padding: 0 }}>
            {list
              .filter((e) => !e.demo)
              .map((e) => (
                <li key={e.id}>
                  <a
                    className="btn quiet"
                    style={{ width: '100%', justifyContent: 'flex-start' }}
                    href={`#/x/${e.id}/assays`}
                  >
                    {e.name}
                    <span className="muted">{e.lines.join(' · ')}</span>
                  </a>
                </li>
              ))}
          </ul>
        </section>

        <AccuracyCard accuracy={accuracy.state === 'ready' ? accuracy.value : null} />
        <SyncCard />
        <StorageCard />
        <UnreadableCard />
      </main>
    </>
  );
}

import { type ExperimentTab, hrefOf } from '../app/route.ts';
import { useLive } from '../app/use-live.ts';
import { loadExperiment } from '../bench/experiment-data.ts';
import { AssaysTab } from './AssaysTab.tsx';
import { DataTab } from './DataTab.tsx';
import { ResultsTab } from './ResultsTab.tsx';
import { TopBar } from './TopBar.tsx';

const TABS: { tab: ExperimentTab; label: string }[] = [
  { tab: 'assays', label: 'Bench' },
  { tab: 'results', label: 'Fitness' },
  { tab: 'data', label: 'Files' },
];

export function ExperimentScreen({ id, tab }: { id: string; tab: ExperimentTab }) {
  const data = useLive((s) => loadExperiment(s.store, id), [id]);
  if (data.state === 'loading') return <TopBar title="Loading…" back="#/" />;
  if (data.state === 'failed' || !data.value)
    return (
      <>
        <TopBar title="Experiment not found" back="#/" />
        <main>
          <p className="banner alarm">
            {data.state === 'failed' ? data.error : 'No experiment with this id on this device.'}
          </p>
        </main>
      </>
    );
  const d = data.value;
  return (
    <>
      <TopBar title={d.experiment.name} back="#/" />
      {d.experiment.demo && (
        <div className="demo-banner">DEMO DATA — invented plates and counts</div>
      )}
      <main>
        <nav className="tabs" aria-label="Experiment">
          {TABS.map((t) => (
            <a
              key={t.tab}
              href={hrefOf({ screen: 'experiment', id, tab: t.tab })}
              aria-current={t.tab === tab ? 'page' : undefined}
            >
              {t.label}
            </a>
          ))}
        </nav>
        {tab === 'assays' && <AssaysTab data={d} />}
        {tab === 'results' && <ResultsTab data={d} />}
        {tab === 'data' && <DataTab data={d} />}
      </main>
    </>
  );
}

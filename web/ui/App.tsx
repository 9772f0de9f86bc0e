import { useEffect, useState } from 'react';
import { useRoute } from '../app/route.ts';
import { registerServiceWorker } from '../app/service-worker.ts';
import { ExperimentScreen } from './ExperimentScreen.tsx';
import { HomeScreen } from './HomeScreen.tsx';
import { PlateScreen } from './PlateScreen.tsx';
import { SafetyNote } from './SafetyNote.tsx';
import { WriteFailureBanner } from './WriteFailureBanner.tsx';

export function App() {
  const route = useRoute();
  const [update, setUpdate] = useState<(() => void) | null>(null);
  useEffect(() => registerServiceWorker((apply) => setUpdate(() => apply)), []);
  return (
    <>
      <SafetyNote />
      <WriteFailureBanner />
      {update && (
        <div className="banner offer" role="status">
          <span>A new version of Rivalplate is ready. Your work is saved either way.</span>
          <button type="button" className="btn primary" onClick={update}>
            Switch now
          </button>
        </div>
      )}
      {route.screen === 'home' && <HomeScreen />}
      {route.screen === 'experiment' && <ExperimentScreen id={route.id} tab={route.tab} />}
      {route.screen === 'plate' && (
        <PlateScreen experimentId={route.experimentId} plateId={route.plateId} />
      )}
    </>
  );
}

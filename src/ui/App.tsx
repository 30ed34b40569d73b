import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { PlanResult, Scenario } from '../core/types';
import { parseScenario, parseScenarioBytes, scenarioToJson } from '../core/scenario';
import { estimateRun, describeEstimate } from '../core/limits';
import { SkyMap } from './skymap/SkyMap';
import type { SkyFrame, SkyScale } from './skymap/SkyMap';
import { ScenarioPanel } from './panel/ScenarioPanel';
import { ResultsTable } from './results/ResultsTable';
import { TargetsTable } from './results/TargetsTable';
import { Timeline } from './results/Timeline';
import { UsableByFrequency, usableDiffers } from './results/UsableByFrequency';
import { AttenuationPlot } from './results/AttenuationPlot';
import { AntennaTempCharts } from './results/AntennaTempCharts';
import { DepthAreaPlot } from './results/DepthAreaPlot';
import { ExportBar } from './exports/ExportBar';
import { GlobePane, type SiteSample } from './GlobePane';
import { TimeScrubber } from './scrub/TimeScrubber';
import { gcCrossings } from './scrub/gcCrossings';
import { ComparePanel } from './compare/ComparePanel';
import { RunBar } from './RunBar';
import { ViewControls } from './ViewControls';
import { appIssues } from './state/fieldLabels';
import { IssueIndex, draftToCandidate, scenarioToDraft, type Draft } from './state/draft';
import { browserStore, loadStartup, saveScenario, shareLink } from './state/persist';
import { readRecent, rememberScenario, type RecentEntry } from './state/recent';
import { memoryOf, readMemory, withMemory, writeMemory } from './state/modelMemory';
import { RecentMenu } from './recent/RecentMenu';
import { useEngine } from './state/useEngine';
import { downloadText, fileStem } from './exports/download';
import { PLANNING_NOTE, antennaShort, bodyLabel, latLabel, lonLabel } from './caption';
import { useWidth } from './useWidth';
import type { SkyQuantity } from './skymap/SkyMap';
import { useSurvey } from './survey/useSurvey';
import { SurveyPanel } from './survey/SurveyPanel';
import { QuantitySelect } from './sensitivity/QuantitySelect';
import { NoiseNote } from './sensitivity/NoiseNote';
import type { FieldIssue } from '../core/types';
import { SkyMapError, SKY_MAP_LIMITS, type HealpixMap } from '../core/sky/fitsMap';
import { checkSkyMaps, type LoadedSkyMap } from '../core/sky/model';
import { getSkyMap, isQuotaError, putSkyMap } from './state/skyMapStore';
import { readSkyMapInWorker } from './state/skyMapReader';
import { withMapRow, type SkyMapStatus, type SkyMessage } from './panel/SkyFields';
import { BeamView } from './antenna/BeamView';
import { antennaLabelsByPath } from './antenna/labels';
import { skyBeamAt } from '../core/antenna/cuts';
import { isPlainZenithDish } from '../core/antenna/pointing';
import { vecToRaDecDeg } from '../core/frames';

// The planner shell: scenario draft -> validated scenario -> worker run ->
// result views. The last good result stays on screen whatever the draft holds.

type PhoneTab = 'scenario' | 'map' | 'results';
const PHONE_TABS: [PhoneTab, string][] = [['scenario', 'Scenario'], ['map', 'Map & globe'], ['results', 'Results']];

/** Runs estimated to take longer than this wait for the Compute button. */
export const AUTO_RUN_MAX_S = 8;
const DEBOUNCE_MS = 350;

export function App() {
  const startup = useMemo(() => loadStartup(), []);
  // the fields of the beam models not in use come back from the last visit (a scenario carries only its model's)
  const [draft, setDraft] = useState<Draft>(() => withMemory(scenarioToDraft(startup.scenario), readMemory(browserStore())));
  const [notices, setNotices] = useState<string[]>(startup.notice ? [startup.notice] : []);
  // a whole-scenario replacement (link, import, recent) keeps the one replaced: one click back, and the recent list
  const [undo, setUndo] = useState<{ text: string; previous: Scenario } | null>(() => startup.replaced
    ? { text: `Opened the scenario in the link. Your saved scenario "${startup.replaced.name || 'Untitled scenario'}" is kept under Recent.`, previous: startup.replaced }
    : null);
  const [recent, setRecent] = useState<RecentEntry[]>(() => readRecent(browserStore()));
  const [auto, setAuto] = useState(true);
  const engine = useEngine();
  const [freqIndex, setFreqIndex] = useState(0);
  const [frame, setFrame] = useState<SkyFrame>('equatorial');
  const [scale, setScale] = useState<SkyScale>('linear');
  const [flip, setFlip] = useState(false);
  const [compare, setCompare] = useState(false);
  const [mapRef, mapWidth] = useWidth<HTMLDivElement>(900);
  const importRef = useRef<HTMLInputElement>(null);
  const [scrubOn, setScrubOn] = useState(false);
  const [scrubIndex, setScrubIndex] = useState(0);
  const [pinned, setPinned] = useState<PlanResult | null>(null);
  const [showDiff, setShowDiff] = useState(false);
  // At phone width (CSS, <= 480 px) one section shows at a time, chosen by tabs; wider screens show all.
  const [phoneTab, setPhoneTab] = useState<PhoneTab>('map');

  const parsed = useMemo(() => parseScenario(draftToCandidate(draft)), [draft]);
  const scenario: Scenario | null = parsed.ok ? parsed.scenario : null;
  // the estimate counts the sky model's build while the plan worker has not built it yet
  // engine.result and engine.cancelled: a finished run warms the worker and builds sky maps; a cancel replaces the worker with a cold one
  const estimate = useMemo(() => (scenario ? estimateRun(scenario, { skyMapBuilt: engine.skyMapBuilt, coldWorker: !engine.warm() }) : null), [scenario, engine.skyMapBuilt, engine.result, engine.cancelled]); // eslint-disable-line react-hooks/exhaustive-deps

  // the user's sky maps: bytes in IndexedDB by file name, read maps in memory
  const [skyLoaded, setSkyLoaded] = useState<Record<string, HealpixMap>>({});
  const [skyStatus, setSkyStatus] = useState<Record<string, SkyMapStatus>>({});
  const [skyMsg, setSkyMsg] = useState<SkyMessage | null>(null);
  // fraction read of each map being read back from storage (in the map worker)
  const [skyProgress, setSkyProgress] = useState<Record<string, number>>({});
  const [skyVersion, setSkyVersion] = useState(0);
  const skyLoadedRef = useRef(skyLoaded);
  skyLoadedRef.current = skyLoaded;
  const skyIssues = useMemo(() => mapModelIssues(scenario, skyLoaded, skyStatus), [scenario, skyLoaded, skyStatus]);

  const issues = useMemo(
    () => new IssueIndex(appIssues([...(parsed.ok ? [] : parsed.issues), ...(estimate?.problems ?? []), ...skyIssues], antennaLabelsByPath(draft.beamModel, draft.ant))),
    [parsed, estimate, skyIssues, draft.beamModel, draft.ant],
  );
  const runnable = scenario !== null && estimate !== null && estimate.problems.length === 0 && skyIssues.length === 0;
  // site survey and noise map
  const survey = useSurvey(runnable ? scenario : null, (s) => loadedFor(s, skyLoadedRef.current));
  const [quantity, setQuantity] = useState<SkyQuantity>('exposure');
  const surveyGlobeLayer = survey.showOnGlobe && survey.layer && survey.done?.scenario.site.body === draft.body ? survey.globeLayer : null;
  const key = runnable ? scenarioToJson(scenario) : null;

  const result: PlanResult | null = engine.result;
  const resultKey = useMemo(() => (result ? scenarioToJson(result.scenario) : null), [result]);
  const requested = useRef<string | null>(null);

  const start = useCallback((s: Scenario) => {
    requested.current = scenarioToJson(s);
    engine.run(s, loadedFor(s, skyLoadedRef.current));
  }, [engine]);

  // Maps the draft names: read from this browser's storage once; a name not stored is reported, not guessed.
  const mapNames = (draft.skyMaps ?? []).map((m) => m.file).join('\n');
  useEffect(() => {
    for (const name of mapNames ? mapNames.split('\n') : []) {
      if (skyStatus[name]) continue;
      setSkyStatus((p) => ({ ...p, [name]: 'loading' }));
      getSkyMap(name).then(async (blob) => {
        if (!blob) {
          setSkyStatus((p) => ({ ...p, [name]: 'missing' }));
          if ((draft.skyModel ?? 'galaxy') === 'map') {
            setNotices((p) => [...p, `The scenario names the sky map ${name}, which this browser does not hold (a link or a scenario file carries only the map's name): load the file again in the Sky section.`]);
          }
          return;
        }
        // read in the map worker: a large map would otherwise freeze the page
        const map = await readSkyMapInWorker(blob, name, (f) => setSkyProgress((p) => ({ ...p, [name]: f })));
        setSkyLoaded((p) => ({ ...p, [name]: map }));
        setSkyStatus((p) => ({ ...p, [name]: 'loaded' }));
        setSkyVersion((v) => v + 1);
      }).catch((e: unknown) => {
        setSkyStatus((p) => ({ ...p, [name]: 'missing' }));
        setSkyMsg({ text: `The stored sky map ${name} could not be read back (${e instanceof Error ? e.message : String(e)}): load the file again.`, error: true });
      });
    }
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [mapNames]);

  const addSkyFiles = async (files: File[]) => {
    for (const file of files) {
      const name = file.name;
      if (file.size > SKY_MAP_LIMITS.max_file_bytes) {
        setSkyMsg({ text: `${name} was not loaded: it is ${(file.size / 2 ** 20).toFixed(0)} MB, more than the ${SKY_MAP_LIMITS.max_file_bytes / 2 ** 20} MB a sky map may be. Your sky settings are unchanged.`, error: true });
        continue;
      }
      let map: HealpixMap;
      try {
        // the worker reads the File itself: the page stays responsive and never holds the whole file
        const reading = `Reading ${name} (${(file.size / 2 ** 20).toFixed(1)} MB)…`;
        setSkyMsg({ text: reading, error: false, progress: 0 });
        map = await readSkyMapInWorker(file, name, (f) => setSkyMsg({ text: reading, error: false, progress: f }));
        // the maps already listed must agree with it in coordinates and nside
        const others: LoadedSkyMap[] = (draft.skyMaps ?? []).filter((r) => r.file !== name && skyLoadedRef.current[r.file])
          .map((r, i) => ({ file: r.file, frequency_mhz: i + 1, map: skyLoadedRef.current[r.file] }));
        const all = [...others, { file: name, frequency_mhz: others.length + 1, map }];
        checkSkyMaps({ model: 'map', maps: all.map((m) => ({ file: m.file, frequency_mhz: m.frequency_mhz })) }, all);
      } catch (e) {
        const why = e instanceof SkyMapError ? e.message : `${name} could not be read: ${e instanceof Error ? e.message : String(e)}`;
        setSkyMsg({ text: `${why.replace(/^sky\.maps: /, '')} Your sky settings are unchanged.`, error: true });
        continue;
      }
      setSkyLoaded((p) => ({ ...p, [name]: map }));
      setSkyStatus((p) => ({ ...p, [name]: 'loaded' }));
      setSkyVersion((v) => v + 1);
      setDraft((d) => ({ ...d, skyModel: 'map', skyMaps: withMapRow(d.skyMaps ?? [], name) }));
      const what = `${name}: nside ${map.fileNside}${map.nside !== map.fileNside ? ` (used at ${map.nside})` : ''}, ${map.ordering}, coordinates ${map.coordsys}, unit ${map.unit}`;
      try {
        await putSkyMap(name, file);
        setSkyMsg({ text: `Loaded ${what}; kept in this browser's storage.`, error: false });
      } catch (e) {
        setSkyMsg({
          text: isQuotaError(e)
            ? `Loaded ${what}, but this browser's storage is full, so it is kept only until the page is closed: free some site data or load it again next time.`
            : `Loaded ${what}, but it could not be kept in this browser's storage (${e instanceof Error ? e.message : String(e)}): load it again next time.`,
          error: true,
        });
      }
    }
  };

  // a map read after the scenario was already valid (from storage, or a file replaced under the same name): compute with it
  useEffect(() => {
    if (skyVersion > 0 && runnable && scenario!.sky?.model === 'map' && auto) start(scenario!);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [skyVersion]);

  // the last valid scenario: what a replacement sets aside when the form holds something invalid
  const lastGood = useRef<Scenario>(startup.scenario);
  if (scenario) lastGood.current = scenario;
  const replaceScenario = (next: Scenario, undoText: string) => {
    const prev = lastGood.current;
    if (scenarioToJson(prev) !== scenarioToJson(next)) {
      const list = rememberScenario(browserStore(), prev);
      if (list) setRecent(list);
      else setNotices((p) => [...p, 'The replaced scenario could not be added to Recent (storage full or disabled); use "Go back" or export it.']);
      setUndo({ text: undoText.replace('%s', prev.name || 'Untitled scenario'), previous: prev });
    }
    setDraft((d) => withMemory(scenarioToDraft(next), memoryOf(d)));
    setFreqIndex(0);
    start(next);
  };

  // The startup scenario is computed on open, whatever its size.
  // (Under StrictMode's double effects the second start supersedes the first; the engine drops the stale run.)
  useEffect(() => {
    if (runnable) start(scenario!);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, []);

  // Later edits: save once valid; recompute automatically when the run is short.
  useEffect(() => {
    if (!runnable || key === null) return;
    const t = setTimeout(() => {
      const n = saveScenario(scenario!);
      if (n) setNotices((p) => (p.includes(n) ? p : [...p, n]));
      if (auto && key !== requested.current && key !== resultKey && estimate!.seconds_estimate <= AUTO_RUN_MAX_S) start(scenario!);
    }, DEBOUNCE_MS);
    return () => clearTimeout(t);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [key, auto]);

  const patch = useCallback((p: Partial<Draft>) => setDraft((d) => ({ ...d, ...p })), []);

  // every model's typed fields, kept in the browser so a reload gives back what another model had
  // eslint-disable-next-line react-hooks/exhaustive-deps
  const memory = useMemo(() => memoryOf(draft), [draft.aperture, draft.fwhmFactor, draft.ant]);
  useEffect(() => {
    const t = setTimeout(() => writeMemory(browserStore(), memory), DEBOUNCE_MS);
    return () => clearTimeout(t);
  }, [memory]);

  const nFreq = result ? result.maps.length : 0;
  const fi = Math.min(freqIndex, Math.max(0, nFreq - 1));
  const stale = result !== null && key !== null && key !== resultKey;

  // time scrubber: one track sample drives the beam marker, the globe arrows and the timeline cursor
  const si = result ? Math.min(scrubIndex, result.track.n - 1) : 0;
  const crossings = useMemo(
    () => (result ? gcCrossings(result.track, result.scenario.map.galactic_center_radius_deg) : []),
    [result],
  );
  const scrub = useMemo(() => {
    if (!result || !scrubOn) return null;
    const t = result.track;
    const sample: SiteSample = {
      ms: t.t0_ms + si * t.step_min * 60_000,
      sunAz: t.sun_az_deg[si], sunEl: t.sun_elev_deg[si],
      earthAz: t.earth_az_deg ? t.earth_az_deg[si] : null, earthEl: t.earth_elev_deg ? t.earth_elev_deg[si] : null,
    };
    const usable = result.usable[si] === 1;
    const s = result.scenario;
    const f = s.telescope.frequencies_mhz[Math.min(freqIndex, s.telescope.frequencies_mhz.length - 1)];
    // a circular dish at the zenith keeps its FWHM circle; any other antenna shows each feed's half-power outline
    if (isPlainZenithDish(s)) return { sample, beamAt: { ra_deg: t.ra_deg[si], dec_deg: t.dec_deg[si], usable } };
    const b = skyBeamAt(s, t, si, f);
    const [ra, dec] = vecToRaDecDeg(b.boresights[0]);
    return { sample, beamAt: { ra_deg: ra, dec_deg: dec, usable, outlines: b.outlines, boresights: b.boresights } };
  }, [result, scrubOn, si, freqIndex]);

  // comparison: the pinned result is A, the current one B; a difference map needs the same frequencies and nside
  const diffOk = pinned !== null && result !== null && pinned !== result &&
    pinned.scenario.map.nside === result.scenario.map.nside &&
    pinned.scenario.telescope.frequencies_mhz.join(',') === result.scenario.telescope.frequencies_mhz.join(',');
  const diffOn = showDiff && diffOk;
  const diff = useMemo(() => (diffOn && result ? { other: result, labelA: 'A', labelB: 'B' } : null), [diffOn, result]);

  const importFile = async (file: File) => {
    let bytes: Uint8Array;
    try {
      bytes = new Uint8Array(await file.arrayBuffer());
    } catch (e) {
      setNotices((p) => [...p, `Could not read ${file.name}: ${String(e)}`]);
      return;
    }
    // the bytes, as the CLI reads them: a binary or non-UTF-8 file gets the same message in both
    const r = parseScenarioBytes(bytes, file.name);
    if (!r.ok) {
      setNotices((p) => [...p, `${file.name} was not imported; your current scenario is unchanged. ${r.issues.slice(0, 5).map((i) => i.message).join(' ')}`]);
      return;
    }
    replaceScenario(r.scenario, `Imported ${file.name}. The scenario it replaced, "%s", is kept under Recent.`);
  };

  return (
    <div className="app">
      <header className="top">
        <div className="brand">
          <span className="wordmark">Swathe</span>
          <span className="tagline">sky coverage of a fixed (drift-scan) telescope</span>
        </div>
        <div className="top-actions">
          <RecentMenu entries={recent} onOpen={(e) => replaceScenario(e.scenario, 'Opened a recent scenario. The one it replaced, "%s", is kept under Recent.')} />
          <button type="button" onClick={() => importRef.current?.click()}>Import scenario JSON</button>
          <input ref={importRef} type="file" accept=".json,application/json" className="hidden-file" tabIndex={-1}
            aria-label="Scenario JSON file"
            onChange={(e) => { const f = e.target.files?.[0]; if (f) void importFile(f); e.target.value = ''; }} />
          <button type="button" disabled={!scenario}
            onClick={() => scenario && downloadText(scenarioToJson(scenario), `${fileStem(scenario.name)}.scenario.json`, 'application/json')}>
            Export scenario JSON
          </button>
          <button type="button" disabled={!scenario} title="Copy a link that opens this scenario"
            onClick={() => {
              if (!scenario) return;
              const link = shareLink(scenario);
              // a link carries a sky map's name, never its bytes
              const maps = scenario.sky?.model === 'map' ? (scenario.sky.maps ?? []).map((m) => m.file) : [];
              const mapNote = maps.length ? ` It names the sky map${maps.length > 1 ? 's' : ''} ${maps.join(', ')} but does not carry ${maps.length > 1 ? 'them' : 'it'}: whoever opens it must load ${maps.length > 1 ? 'them' : 'it'} again in the Sky section.` : '';
              const say = (n: string) => setNotices((p) => [...p.filter((x) => !x.startsWith('Link')), n + mapNote]);
              navigator.clipboard?.writeText(link).then(
                () => say('Link to this scenario copied to the clipboard.'),
                () => say(`Link to this scenario (copy it by hand): ${link}`),
              ) ?? say(`Link to this scenario (copy it by hand): ${link}`);
            }}>
            Copy link
          </button>
        </div>
      </header>
      {(notices.length > 0 || undo) && (
        <div className="notices" role="status" data-testid="notices">
          {undo && (
            <p className="notice notice-undo" data-testid="undo-notice">
              <span>{undo.text}</span>
              <span className="notice-acts">
                <button type="button" className="small" onClick={() => { const u = undo; setUndo(null); replaceScenario(u.previous, 'Went back. The scenario you left, "%s", is kept under Recent.'); }}>
                  Go back to “{undo.previous.name || 'Untitled scenario'}”
                </button>
                <button type="button" className="icon" aria-label="Dismiss notice" onClick={() => setUndo(null)}>×</button>
              </span>
            </p>
          )}
          {notices.map((n, i) => (
            <p key={i} className="notice">
              <span>{n}</span>
              <button type="button" className="icon" aria-label="Dismiss notice" onClick={() => setNotices((p) => p.filter((_, j) => j !== i))}>×</button>
            </p>
          ))}
        </div>
      )}
      <nav className="phone-tabs" role="tablist" aria-label="Sections of the page"
        onKeyDown={(e) => {
          // tab pattern: the arrow keys move between the tabs
          const k = PHONE_TABS.findIndex(([id]) => id === phoneTab);
          const next = e.key === 'ArrowRight' ? k + 1 : e.key === 'ArrowLeft' ? k - 1 : null;
          if (next === null) return;
          e.preventDefault();
          const id = PHONE_TABS[(next + PHONE_TABS.length) % PHONE_TABS.length][0];
          setPhoneTab(id);
          document.getElementById(`tab-${id}`)?.focus();
        }}>
        {PHONE_TABS.map(([id, label]) => (
          <button key={id} type="button" role="tab" id={`tab-${id}`} aria-selected={phoneTab === id} tabIndex={phoneTab === id ? 0 : -1}
            className={phoneTab === id ? 'on' : undefined} onClick={() => { setPhoneTab(id); window.scrollTo({ top: 0 }); }}>
            {label}{id === 'scenario' && issues.size > 0 ? ` (${issues.size} ⚠)` : ''}
          </button>
        ))}
      </nav>
      <div className="layout" data-phone-tab={phoneTab}>
        <aside className="side" aria-labelledby="scenario-head">
          <h2 id="scenario-head">Scenario</h2>
          <p className="intro">
            Set the site (type it, or click the globe), the span and the telescope. Short runs recompute as you type;
            the downloads sit under the map.
          </p>
          <ScenarioPanel draft={draft} issues={issues} scenario={scenario} onChange={patch}
            sky={{ status: skyStatus, progress: skyProgress, message: skyMsg, onFiles: (f) => void addSkyFiles(f) }} />
        </aside>
        <main className="main">
          <RunBar
            engine={engine}
            estimateText={estimate && runnable ? describeEstimate(estimate) : null}
            estimateSeconds={estimate && runnable ? estimate.seconds_estimate : null}
            invalid={!runnable}
            issueCount={issues.size}
            stale={stale}
            auto={auto}
            onAuto={setAuto}
            onCompute={() => scenario && runnable && start(scenario)}
            longRun={estimate !== null && estimate.seconds_estimate > AUTO_RUN_MAX_S}
          />
          <section className="view" aria-label="Sky map and site">
            <div className="map-col" ref={mapRef}>
              {result ? (
                <>
                  <h2 className="result-title" data-testid="result-title">
                    <span>{result.scenario.name || 'Untitled scenario'}</span>
                    <span className="sub">
                      {bodyLabel(result.scenario.site.body)} {latLabel(result.scenario.site.lat_deg)}, {lonLabel(result.scenario.site.lon_deg)} ·{' '}
                      {result.scenario.span.start.slice(0, 10)} to {result.scenario.span.end.slice(0, 10)} · {antennaShort(result.scenario)}
                    </span>
                  </h2>
                  <ViewControls
                    freqs={result.scenario.telescope.frequencies_mhz}
                    freqIndex={fi} onFreq={setFreqIndex}
                    frame={frame} onFrame={setFrame}
                    scale={scale} onScale={setScale} scaleFixedLog={quantity === 'sky' && !compare && !diffOn}
                    flip={flip} onFlip={setFlip}
                    compare={compare} onCompare={setCompare}
                  />
                  <div className="tools" role="group" aria-label="Time and comparison">
                    <QuantitySelect value={quantity} onChange={setQuantity} disabled={compare || diffOn}
                      note={compare || diffOn ? 'Comparison and difference maps show exposure' : 'Colour the map by exposure, by radiometer noise or by the sky model\'s brightness temperature'}
                      skyTemp={result.sky_k !== undefined} />
                    <button type="button" className="small" title="Figures of merit for a grid of sites over the body (below the results)"
                      onClick={() => { setPhoneTab('results'); requestAnimationFrame(() => document.getElementById('survey-head')?.scrollIntoView({ behavior: 'smooth', block: 'start' })); }}>
                      Site survey ↓
                    </button>
                    <label className="check">
                      <input type="checkbox" checked={scrubOn} onChange={(e) => setScrubOn(e.target.checked)} /> Time scrubber
                    </label>
                    <button type="button" className="small" onClick={() => { setPinned(result); setShowDiff(false); }}
                      disabled={pinned === result} title="Keep this result as plan A, then change the scenario to get plan B">
                      {pinned === result ? 'Pinned as A' : pinned ? 'Pin this result as A (replace)' : 'Pin this result as A'}
                    </button>
                    {pinned && (
                      <label className="check" title={diffOk ? 'Exposure of B minus A at the selected frequency' : 'Needs a different plan B with the same frequencies and nside'}>
                        <input type="checkbox" checked={diffOn} disabled={!diffOk} onChange={(e) => setShowDiff(e.target.checked)} /> Map B − A
                      </label>
                    )}
                  </div>
                  {scrubOn && <TimeScrubber result={result} index={si} onIndex={setScrubIndex} crossings={crossings} />}
                  <div className="map-box">
                    {diffOn && pinned ? (
                      <SkyMap result={pinned} freqIndex={fi} frame={frame} scale={scale} flipLongitude={flip} compare={false}
                        diff={diff} beamAt={scrub?.beamAt ?? null} />
                    ) : (
                      <SkyMap result={result} freqIndex={fi} frame={frame} scale={scale} flipLongitude={flip} compare={compare}
                        beamAt={scrub?.beamAt ?? null} quantity={quantity} />
                    )}
                  </div>
                </>
              ) : (
                <div className="placeholder" aria-live="polite">
                  {engine.running ? <p>Computing the first map…</p> : <p>No result yet. {runnable ? 'Press Compute.' : 'Fix the marked fields in the scenario panel.'}</p>}
                </div>
              )}
            </div>
            <div className="globe-col">
              {/* always mounted, so the globe is not rebuilt when the first result arrives */}
              <GlobePane draft={draft} scenario={scenario ?? result?.scenario ?? null} sample={scrub?.sample ?? null}
                shadingReady={result !== null} onPick={(lat, lon) => patch({ lat: String(lat), lon: String(lon) })}
                valueLayer={surveyGlobeLayer} />
            </div>
          </section>
          {result && (
            <>
              <ExportBar result={result} pngBase={diffOn && pinned ? pinned : result} mapWidth={mapWidth}
                view={{ freqIndex: fi, frame, scale, flipLongitude: flip, compare: diffOn ? false : compare, beamAt: scrub?.beamAt ?? null, diff, quantity }} />
              <section className="results-sec" aria-labelledby="results-head">
                <h2 id="results-head">Results</h2>
                <ResultsTable result={result} selected={fi} onSelect={setFreqIndex} />
                <NoiseNote result={result} freqIndex={fi} />
                <TargetsTable result={result} selected={fi} />
                <BeamView scenario={result.scenario} selected={fi} />
                <Timeline result={result} scrubMs={scrub ? scrub.sample.ms : null} markers={crossings} />
                {result.t_ant && result.t_ant.series[fi] && <AntennaTempCharts result={result} freqIndex={fi} scrubMs={scrub ? scrub.sample.ms : null} />}
                {result.noise_maps && <DepthAreaPlot result={result} />}
                {usableDiffers(result) && <UsableByFrequency result={result} scrubMs={scrub ? scrub.sample.ms : null} />}
                {result.scenario.constraints.diffraction && <AttenuationPlot result={result} index={scrubOn ? si : null} />}
              </section>
              {pinned && pinned !== result && (
                <ComparePanel a={pinned} b={result} freqIndex={fi} onSelect={setFreqIndex} onUnpin={() => { setPinned(null); setShowDiff(false); }} />
              )}
            </>
          )}
          <SurveyPanel survey={survey} scenario={runnable ? scenario : null}
            siteLat={Number(draft.lat)} siteLon={Number(draft.lon)}
            onPick={(lat, lon) => patch({ lat: String(lat), lon: String(lon) })} />
          <footer className="foot">
            <p><strong>{PLANNING_NOTE}</strong></p>
            <p>
              Models: IAU rotation models via astronomy-engine; zenith track sampled over the span; HEALPix RING maps in J2000;
              {' '}Gaussian (FWHM = k λ/D), Airy, elliptical Gaussian, thin-dipole (Balanis eq. 4-62a, image theory over a perfect ground) or tabulated beams;
              {' '}exposure is usable time weighted by beam power, in hours.
            </p>
          </footer>
        </main>
      </div>
    </div>
  );
}

/** The read maps of a map-model scenario, in the order of `sky.maps` (empty for the other models). */
function loadedFor(s: Scenario, loaded: Record<string, HealpixMap>): LoadedSkyMap[] {
  if (s.sky?.model !== 'map') return [];
  return (s.sky.maps ?? []).filter((m) => loaded[m.file]).map((m) => ({ file: m.file, frequency_mhz: m.frequency_mhz, map: loaded[m.file] }));
}

/** Problems of a map-model scenario the parser cannot see: a map not in memory, maps that do not agree. */
function mapModelIssues(s: Scenario | null, loaded: Record<string, HealpixMap>, status: Record<string, SkyMapStatus>): FieldIssue[] {
  if (!s || s.sky?.model !== 'map') return [];
  const out: FieldIssue[] = [];
  (s.sky.maps ?? []).forEach((m) => {
    if (loaded[m.file]) return;
    out.push({
      field: 'sky.maps',
      message: status[m.file] === 'loading'
        ? `The sky map ${m.file} is being read from this browser's storage.`
        : `The sky map ${m.file} (${m.frequency_mhz} MHz) is not in this browser's storage: a link or a scenario file carries only the map's name. Load the file again here.`,
    });
  });
  if (out.length) return out;
  try {
    checkSkyMaps(s.sky, loadedFor(s, loaded));
  } catch (e) {
    if (e instanceof SkyMapError) return [{ field: e.field, message: e.message }];
    throw e;
  }
  return [];
}

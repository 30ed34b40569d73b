import { createRoot } from 'react-dom/client';

// Placeholder until the planner UI lands (issue: browser planner).
function App() {
  return <main><h1>Swathe</h1><p>Sky coverage planner for fixed zenith-pointing telescopes.</p></main>;
}

createRoot(document.getElementById('root')!).render(<App />);

import { CautionsPanel } from '@/components/cautions-panel';

// Placeholder until the Tune screen lands.
export default function TunePage() {
  return <CautionsPanel />;
}

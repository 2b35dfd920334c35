// The records API's JSON (docs/api.md, "Bench records"). Provisional copy of the contract until the
// server's types are in shared/api.ts; then this file only re-exports them.

export interface RecordPhoto {
  n: number;
  contentType: string;
  width: number;
  height: number;
  bytes: number;
  url: string;
  previewUrl: string;
}

export interface BenchRecord {
  id: number;
  date: string;
  target: string;
  kind: 'mix' | 'build';
  label: string;
  formula: string;
  mixer: string | null;
  doughTemperature: number | null;
  waterTemperature: number | null;
  ripe: boolean | null;
  note: string;
  initials: string;
  recordedAt: string;
  createdAt: string;
  by: { id: number; name: string; email: string };
  clientId: string | null;
  corrects: number | null;
  correctedBy: number | null;
  hidden: { by: string; at: string; reason: string } | null;
  photos: RecordPhoto[];
  friction: { rise: number; friction: number; n: number; waterTemperature: number; waterFrom: 'measured' | 'sheet' } | null;
}

export interface RecordTarget {
  target: string;
  kind: 'mix' | 'build';
  label: string;
  formula: string;
  mixer: string | null;
  doughTemperature: number | null;
  waterTemperature: number | null;
  start: string | null;
}

export interface RecordListResponse {
  date: string;
  targets: RecordTarget[];
  records: BenchRecord[];
}

export interface FrictionProposal {
  mixer: string;
  formula: string;
  title: string;
  mixes: number;
  used: number;
  outliers: { recordId: number; date: string; rise: number }[];
  rise: number;
  friction: number;
  from: string;
  to: string;
  basis: string;
  current: { rise: number; riseFrom: string; plan: string; path: string } | null;
  status: 'propose' | 'agrees' | 'too few';
  change: string | null;
}

export interface FrictionResponse {
  minimum: number;
  rule: string;
  proposals: FrictionProposal[];
}

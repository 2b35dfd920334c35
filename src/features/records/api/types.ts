// The records API's JSON (docs/api.md, "Bench records"): the server's own types.
export type { BenchRecord, FrictionResponse, RecordListResponse, RecordPhoto } from '#shared/api';
export type { FrictionProposal } from '#shared/friction';
import type { RecordListResponse } from '#shared/api';

/** A target as GET /api/plans/:date/records lists it (shared/records.ts recordTargets). */
export type RecordTarget = RecordListResponse['targets'][number];

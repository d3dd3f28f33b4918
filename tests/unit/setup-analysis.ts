// Setup for the unit project: the analysis's Clipper build is WebAssembly loaded
// asynchronously, so it is loaded once before any test file's tests call analyze().
import { loadAnalysis } from '@/lib/analysis';

await loadAnalysis();

/**
 * Roundsmith's own routing: road graph, snapping, drive-time matrices and directions, all from the
 * region's GeoJSON with no outside service. Pure TypeScript apart from reading the region files in
 * getRoadGraph(); nothing here imports Astro, the database or React.
 */
import { fileStamp, readCollection, sourcePath } from './region-file';
import { loadRoadGraph, withSpeeds, type RoadGraph } from './graph';
import type { SpeedOverrides } from './speeds';
import { readSpeedTable } from './speed-table';

export { loadRoadGraph, withSpeeds, roadLabel, type RoadGraph, type RoadInfo, type SkippedFeature } from './graph';
export { snapPoint, type SnappedPoint } from './snap';
export { buildMatrix, type DriveMatrix } from './matrix';
export { directions, formatDistance, type Directions, type DirectionStep, type StepKind, type Units } from './directions';
export { DEFAULT_SPEEDS, DRIVABLE_CLASSES, parseMaxspeedKmh, resolveSpeeds, type RoadClass, type RoutingSpeeds, type SpeedOverrides } from './speeds';
export { haversineM, bearingDeg, type LatLon } from './geo';
export { readSpeedTable, speedTableSchema, speedTableOverrides, type SpeedTable } from './speed-table';

let cached: { stamp: number; file: string; graph: RoadGraph } | null = null;
const bySpeeds = new Map<string, RoadGraph>();

/**
 * The region's road graph under the practice's speed table (tiles/source/speeds.json, when present;
 * otherwise the defaults), or under explicitly given speeds. Built once from tiles/source/roads.geojson
 * and kept in memory; rebuilt when either file changes (a roads import, an edited speed table).
 */
export function getRoadGraph(speeds?: SpeedOverrides): RoadGraph {
  const file = sourcePath('roads.geojson');
  const speedFile = sourcePath('speeds.json');
  const stamp = fileStamp(file) * 31 + fileStamp(speedFile);
  if (!cached || cached.stamp !== stamp || cached.file !== file) {
    cached = { stamp, file, graph: loadRoadGraph(readCollection(file), readSpeedTable(speedFile)) };
    bySpeeds.clear();
  }
  if (!speeds) return cached.graph;
  const key = JSON.stringify(speeds);
  let graph = bySpeeds.get(key);
  if (!graph) {
    graph = withSpeeds(cached.graph, speeds);
    if (bySpeeds.size >= 16) bySpeeds.delete(bySpeeds.keys().next().value!);
    bySpeeds.set(key, graph);
  }
  return graph;
}

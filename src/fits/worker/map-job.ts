import type { TransportMap } from '../../engine/map';
import { parseMapJSON } from '../../engine/map-json';
import { restoreMap } from '../../engine/methods';
import type { MapPointsRequest, MappedPoints } from './messages';

/**
 * A worker's side of mapping rows off the page: it reads the map's JSON (checked by parseMapJSON, never evaluated),
 * keeps the last map it read so that the pieces of one call read it once, and maps the rows. O(the map's work) plus
 * O(size of the map) when the map changes.
 */
export class MapJobs {
  private json = '';
  private map: TransportMap | null = null;

  /** The mapped rows of a request; throws the map's own RemapError (the worker sends it back). */
  run(req: MapPointsRequest): MappedPoints {
    if (this.map === null || req.json !== this.json) {
      this.map?.dispose();
      this.map = restoreMap(parseMapJSON(req.json));
      this.json = req.json;
    }
    const mapped = req.verb === 'apply' ? this.map.apply(req.points) : this.map.invert(req.points);
    return { type: 'mapped', id: req.id, data: mapped.data, outside: mapped.outside };
  }
}

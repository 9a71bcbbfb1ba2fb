/**
 * Test oracle: heliocentric planet positions from the full VSOP87 theory (Bretagnon & Francou
 * 1988, A&A 202, 309), series B: spherical coordinates referred to the J2000 mean ecliptic and
 * equinox, as shipped in the npm package `astronomia` (devDependency; `planetposition` module and
 * its `data/vsop87B*` tables). Independent of astronomy-engine, which truncates the same theory.
 */
import { createRequire } from 'node:module';

type Coord = { lon: number; lat: number; range: number };
interface PlanetCtor { new (data: unknown): { position2000(jde: number): Coord } }

const load = createRequire(__filename);

export type VsopPlanet = 'mercury' | 'venus' | 'earth' | 'mars' | 'jupiter' | 'saturn' | 'uranus' | 'neptune';

const cache = new Map<VsopPlanet, { position2000(jde: number): Coord }>();

function planet(name: VsopPlanet): { position2000(jde: number): Coord } {
  let p = cache.get(name);
  if (!p) {
    const { Planet } = load('astronomia/planetposition') as { Planet: PlanetCtor };
    const mod = load(`astronomia/data/vsop87B${name}`) as { default?: unknown };
    p = new Planet(mod.default ?? mod);
    cache.set(name, p);
  }
  return p;
}

/** Heliocentric ecliptic longitude, latitude (radians) and distance (AU), J2000 ecliptic, at a TT Julian Date. */
export function vsop87Spherical(name: VsopPlanet, jdTt: number): Coord {
  return planet(name).position2000(jdTt);
}

/** Heliocentric rectangular position, AU, J2000 mean ecliptic and equinox, at a TT Julian Date. */
export function vsop87Vector(name: VsopPlanet, jdTt: number): [number, number, number] {
  const c = vsop87Spherical(name, jdTt);
  const cb = Math.cos(c.lat);
  return [c.range * cb * Math.cos(c.lon), c.range * cb * Math.sin(c.lon), c.range * Math.sin(c.lat)];
}

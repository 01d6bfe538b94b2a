import { readFileSync } from 'node:fs';
import { feature } from 'topojson-client';
const topo = JSON.parse(readFileSync('node_modules/world-atlas/countries-50m.json','utf8'));
const fc: any = feature(topo, topo.objects.countries);
const f = fc.features.find((f: any) => f.properties.name === 'Russia');
const ring = f.geometry.coordinates.map((p: any) => p[0]).sort((a: any, b: any) => b.length - a.length)[0];
ring.forEach((p: any, i: number) => { if (Math.abs(p[0]) >= 179.5) console.log(i, p); });
const fj: any = fc.features.find((f: any) => f.properties.name === 'Fiji');
console.log(JSON.stringify(fj.geometry.coordinates.map((p: any) => p[0]).find((r: any) => r.some((c: any) => c[0] < 0) && r.some((c: any) => c[0] > 0))));

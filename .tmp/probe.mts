import { readFileSync } from 'node:fs';
import { feature } from 'topojson-client';
const topo = JSON.parse(readFileSync('node_modules/world-atlas/countries-50m.json','utf8'));
const fc: any = feature(topo, topo.objects.countries);
for (const f of fc.features) {
  if (!['Fiji','Russia'].includes(f.properties.name)) continue;
  const polys = f.geometry.type === 'Polygon' ? [f.geometry.coordinates] : f.geometry.coordinates;
  polys.forEach((p: any, i: number) => {
    const r = p[0]; const lons = r.map((c: any) => c[0]);
    const mn = Math.min(...lons), mx = Math.max(...lons);
    if (mx - mn > 180 || mx >= 179.9 || mn <= -179.9) console.log(f.properties.name, f.id, i, r.length, mn, mx, Math.min(...r.map((c:any)=>c[1])), Math.max(...r.map((c:any)=>c[1])));
  });
}

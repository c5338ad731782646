/**
 * Built-in target regions: the parts of the world radio amateurs on the low bands aim at, each as
 * a handful of representative points ([lon, lat] degrees, WGS84). Written for this project from
 * general geography (coarse, rounded to about 0.1°; public domain). The points stand for where
 * the stations of a region are, roughly spread over its populated area, so that bearings and
 * distances to them give the region's azimuth span and distance range from any station.
 */
import type { LonLat } from '../project/schema.ts';

export interface RegionDef {
  id: string;
  name: string;
  points: readonly LonLat[];
}

export const REGIONS: readonly RegionDef[] = [
  {
    id: 'europe',
    name: 'Europe',
    points: [
      [-9, 39],
      [-3.7, 40.4],
      [2.3, 48.9],
      [-2, 53.5],
      [8.5, 50],
      [13.4, 52.5],
      [21, 52.2],
      [16.4, 48.2],
      [12.5, 41.9],
      [23.7, 38],
      [10.7, 59.9],
      [24.9, 60.2],
      [30.5, 50.4],
      [37.6, 55.8],
    ],
  },
  {
    id: 'japan',
    name: 'Japan',
    points: [
      [130.4, 33.6],
      [135.5, 34.7],
      [139.7, 35.7],
      [140.9, 38.3],
      [141.3, 43.1],
    ],
  },
  {
    id: 'asia-east',
    name: 'East Asia',
    points: [
      [116.4, 39.9],
      [121.5, 31.2],
      [113.3, 23.1],
      [104.1, 30.7],
      [127, 37.6],
      [126.6, 45.8],
      [121.5, 25],
    ],
  },
  {
    id: 'asia-southeast',
    name: 'South-east Asia',
    points: [
      [100.5, 13.8],
      [106.7, 10.8],
      [101.7, 3.1],
      [103.8, 1.4],
      [106.8, -6.2],
      [121, 14.6],
    ],
  },
  {
    id: 'asia-south',
    name: 'South Asia',
    points: [
      [77.2, 28.6],
      [72.9, 19.1],
      [80.3, 13.1],
      [88.4, 22.6],
      [67, 24.9],
      [79.9, 6.9],
    ],
  },
  {
    id: 'asia-north',
    name: 'Northern and central Asia',
    points: [
      [60.6, 56.8],
      [73.4, 55],
      [82.9, 55],
      [104.3, 52.3],
      [131.9, 43.1],
      [150.8, 59.6],
      [158.6, 53],
      [69.3, 41.3],
    ],
  },
  {
    id: 'middle-east',
    name: 'Middle East',
    points: [
      [35.2, 31.8],
      [44.4, 33.3],
      [46.7, 24.7],
      [51.4, 35.7],
      [55.3, 25.3],
      [58.4, 23.6],
      [32.9, 39.9],
    ],
  },
  {
    id: 'africa-north-west',
    name: 'North and West Africa',
    points: [
      [-7.6, 33.6],
      [3, 36.8],
      [31.2, 30],
      [-17.4, 14.7],
      [-0.2, 5.6],
      [3.4, 6.5],
      [7.5, 9],
    ],
  },
  {
    id: 'africa-east',
    name: 'East and central Africa',
    points: [
      [36.8, -1.3],
      [38.7, 9],
      [32.6, 0.3],
      [39.3, -6.8],
      [45.3, 2],
      [15.3, -4.3],
    ],
  },
  {
    id: 'southern-africa',
    name: 'Southern Africa',
    points: [
      [18.4, -33.9],
      [28, -26.2],
      [31, -29.9],
      [17.1, -22.6],
      [25.9, -24.6],
      [32.6, -25.9],
      [28.3, -15.4],
      [31, -17.8],
    ],
  },
  {
    id: 'indian-ocean',
    name: 'Indian Ocean islands',
    points: [
      [57.5, -20.2],
      [55.5, -21.1],
      [55.5, -4.6],
      [73.5, 4.2],
      [47.5, -18.9],
    ],
  },
  {
    id: 'oceania',
    name: 'Australia and New Zealand',
    points: [
      [151.2, -33.9],
      [145, -37.8],
      [153, -27.5],
      [138.6, -34.9],
      [115.9, -32],
      [130.8, -12.5],
      [147.3, -42.9],
      [174.8, -36.8],
      [172.6, -43.5],
    ],
  },
  {
    id: 'pacific',
    name: 'Pacific islands',
    points: [
      [-157.9, 21.3],
      [-149.6, -17.5],
      [-171.8, -13.8],
      [-175.2, -21.1],
      [178.4, -18.1],
      [166.5, -0.5],
      [158.2, 6.9],
      [-159.8, -21.2],
      [144.8, 13.5],
    ],
  },
  {
    id: 'north-america-east',
    name: 'North America, east',
    points: [
      [-74, 40.7],
      [-71.1, 42.4],
      [-77, 38.9],
      [-80.2, 25.8],
      [-84.4, 33.7],
      [-87.6, 41.9],
      [-79.4, 43.7],
      [-73.6, 45.5],
      [-63.6, 44.6],
    ],
  },
  {
    id: 'north-america-west',
    name: 'North America, west',
    points: [
      [-122.4, 37.8],
      [-118.2, 34],
      [-122.3, 47.6],
      [-123.1, 49.3],
      [-112, 33.5],
      [-105, 39.7],
      [-115.1, 36.2],
      [-114, 51],
      [-149.9, 61.2],
    ],
  },
  {
    id: 'central-america',
    name: 'Mexico and Central America',
    points: [
      [-99.1, 19.4],
      [-103.3, 20.7],
      [-100.3, 25.7],
      [-90.5, 14.6],
      [-87.2, 14.1],
      [-84.1, 9.9],
      [-79.5, 9],
    ],
  },
  {
    id: 'caribbean',
    name: 'Caribbean',
    points: [
      [-82.4, 23.1],
      [-76.8, 18],
      [-70, 18.5],
      [-66.1, 18.4],
      [-61.5, 16.2],
      [-61, 14],
      [-59.6, 13.1],
      [-68.9, 12.1],
      [-61.5, 10.7],
    ],
  },
  {
    id: 'south-america',
    name: 'South America',
    points: [
      [-74.1, 4.7],
      [-66.9, 10.5],
      [-78.5, -0.2],
      [-77, -12],
      [-60, -3.1],
      [-47.9, -15.8],
      [-43.2, -22.9],
      [-46.6, -23.5],
      [-58.4, -34.6],
      [-70.7, -33.4],
      [-65.4, -24.8],
      [-68, -38.9],
    ],
  },
  {
    id: 'north-atlantic',
    name: 'North Atlantic and Arctic islands',
    points: [
      [-21.9, 64.1],
      [-51.7, 64.2],
      [-6.8, 62],
      [15.6, 78.2],
      [-25.7, 37.7],
    ],
  },
  {
    id: 'antarctica',
    name: 'Antarctica',
    points: [
      [166.7, -77.8],
      [-68.1, -67.6],
      [-58.9, -62.2],
      [77.9, -69.4],
      [110.5, -66.3],
      [0, -70.5],
      [139, -66.7],
    ],
  },
];

export function regionById(id: string): RegionDef | undefined {
  return REGIONS.find((r) => r.id === id);
}

import type { Routes } from '@angular/router';
import { provideEchartsCore } from 'ngx-echarts';

/** The coordinator's precision study page (below /desk, which is guarded for coordinators). */
export const PRECISION_ROUTES: Routes = [
  {
    path: '',
    title: 'Precision study · Round desk · Ringlet',
    providers: [
      provideEchartsCore({
        echarts: () => import('../board/echarts-setup').then((m) => m.echarts),
      }),
    ],
    loadComponent: () => import('./precision-page').then((m) => m.PrecisionPage),
  },
];

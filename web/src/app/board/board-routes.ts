import type { Routes } from '@angular/router';
import { provideEchartsCore } from 'ngx-echarts';

export const BOARD_ROUTES: Routes = [
  {
    path: '',
    providers: [
      provideEchartsCore({ echarts: () => import('./echarts-setup').then((m) => m.echarts) }),
    ],
    children: [
      {
        path: '',
        title: 'Consensus board · Ringlet',
        loadComponent: () => import('./board-list').then((m) => m.BoardList),
      },
      {
        path: 'investigations',
        title: 'Investigations · Ringlet',
        loadComponent: () => import('./investigation-list').then((m) => m.InvestigationList),
      },
      {
        path: 'investigations/:id',
        title: 'Investigation · Ringlet',
        loadComponent: () => import('./investigation-page').then((m) => m.InvestigationPage),
      },
      {
        path: 'rounds/:id',
        title: 'Consensus board · Ringlet',
        loadComponent: () => import('./board-page/board-page').then((m) => m.BoardPage),
      },
      {
        path: 'rounds/:id/evaluation',
        title: 'Evaluation · Ringlet',
        loadComponent: () =>
          import('./evaluation-page/evaluation-page').then((m) => m.EvaluationPage),
      },
      {
        path: 'rounds/:id/scores',
        title: 'My scores · Ringlet',
        loadComponent: () => import('./scores-page').then((m) => m.ScoresPage),
      },
    ],
  },
];

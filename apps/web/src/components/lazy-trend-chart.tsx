import { lazy, Suspense, type ComponentProps } from 'react';
import { LoadingLine } from './ui/page';

// recharts is heavy: the chart is its own chunk, loaded when a trend is first shown.
const TrendChart = lazy(() => import('./trend-chart'));

export function LazyTrendChart(props: ComponentProps<typeof TrendChart>) {
  return (
    <Suspense fallback={<LoadingLine label="Drawing the trend…" />}>
      <TrendChart {...props} />
    </Suspense>
  );
}

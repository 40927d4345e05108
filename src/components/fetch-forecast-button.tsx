import type { useFetchForecast } from '../api/forecasts';
import { Button } from './ui';

/** "Fetch latest forecast" for a page's `useFetchForecast`, spinning while the fetch runs. */
export function FetchForecastButton({ fetchForecast }: { fetchForecast: ReturnType<typeof useFetchForecast> }) {
  return (
    <Button variant="secondary" onClick={() => fetchForecast.mutate()} disabled={fetchForecast.isPending}>
      {fetchForecast.isPending ? (
        <>
          <span className="size-4 animate-spin rounded-full border-2 border-line border-t-accent" aria-hidden />
          Fetching forecast…
        </>
      ) : (
        'Fetch latest forecast'
      )}
    </Button>
  );
}

import { useMatches } from 'react-router';
import { useTheme, type Theme, type ThemeScope } from '@/lib/theme.ts';

/** What a route may declare in its `handle` for the shell. */
export type RouteHandle = {
  /** `capture` screens (the recorder) start in the dim-room theme and keep their own choice. */
  themeScope?: ThemeScope;
};

export function useScreenThemeScope(): ThemeScope {
  const matches = useMatches();
  return matches.some((m) => (m.handle as RouteHandle | undefined)?.themeScope === 'capture') ? 'capture' : 'general';
}

/** The theme of the screen on show, and a way to change it for screens of that kind. */
export function useScreenTheme(): [Theme, (t: Theme) => void] {
  return useTheme(useScreenThemeScope());
}

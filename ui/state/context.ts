/** Hands the screens' shared state down the component tree. */
import { createContext } from 'svelte';
import type { HomesState } from './homes.svelte.ts';

const [getHomes, setHomes] = createContext<HomesState>();

/** Makes `state` the Homes state of this component and those inside it; returns it. */
export function provideHomesState(state: HomesState): HomesState {
  return setHomes(state);
}

/** The Homes state an enclosing component provided. */
export function useHomesState(): HomesState {
  return getHomes();
}

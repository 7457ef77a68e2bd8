/** Hands the screens' shared state down the component tree. */
import { createContext } from 'svelte';
import type { HomesState } from './homes.svelte.ts';
import type { WorkspaceState } from './workspace.svelte.ts';

const [getHomes, setHomes] = createContext<HomesState>();
const [getWorkspace, setWorkspace] = createContext<WorkspaceState>();

/** Makes `state` the Homes state of this component and those inside it; returns it. */
export function provideHomesState(state: HomesState): HomesState {
  return setHomes(state);
}

/** The Homes state an enclosing component provided. */
export function useHomesState(): HomesState {
  return getHomes();
}

/** Makes `state` the open home's state of this component and those inside it; returns it. */
export function provideWorkspace(state: WorkspaceState): WorkspaceState {
  return setWorkspace(state);
}

/** The open home's state an enclosing component provided. */
export function useWorkspace(): WorkspaceState {
  return getWorkspace();
}

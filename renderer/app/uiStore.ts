/** Dialog state of the shell (confirmations, the "new design" chooser). Not part of the design. */
import { createStore } from 'zustand/vanilla';

export interface ConfirmRequest {
  title: string;
  text: string;
  confirmLabel: string;
  cancelLabel?: string;
  resolve(ok: boolean): void;
}

export interface UiState {
  confirm: ConfirmRequest | null;
  newDialogOpen: boolean;
}

export const uiStore = createStore<UiState>()(() => ({ confirm: null, newDialogOpen: false }));

export function askConfirm(req: Omit<ConfirmRequest, 'resolve'>): Promise<boolean> {
  return new Promise((resolve) => {
    uiStore.setState({
      confirm: {
        ...req,
        resolve: (ok) => {
          uiStore.setState({ confirm: null });
          resolve(ok);
        },
      },
    });
  });
}

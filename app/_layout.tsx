import { QueryClientProvider } from '@tanstack/react-query';
import { useFonts } from 'expo-font';
import { Slot } from 'expo-router';
import { StatusBar } from 'expo-status-bar';
import { useState } from 'react';
import { SafeAreaProvider } from 'react-native-safe-area-context';

import { createQueryClient } from '@/components/data/query-client';
import { RootError } from '@/components/screens/root/root-error';
import { appFonts } from '@/components/ui/fonts';
import { MessageProvider } from '@/components/ui/message';
import { ThemeProvider } from '@/components/ui/theme';

export { RootError as ErrorBoundary };

export default function RootLayout() {
  const [queryClient] = useState(createQueryClient);
  // The faces are bundled files; until they are ready (a few ms) render nothing rather than flash a fallback face.
  const [fontsLoaded, fontError] = useFonts(appFonts);
  if (!fontsLoaded && !fontError) return null;
  return (
    <SafeAreaProvider>
      <QueryClientProvider client={queryClient}>
        <ThemeProvider>
          <MessageProvider>
            <StatusBar style="auto" />
            <Slot />
          </MessageProvider>
        </ThemeProvider>
      </QueryClientProvider>
    </SafeAreaProvider>
  );
}

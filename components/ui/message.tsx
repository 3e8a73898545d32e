import { createContext, useCallback, useContext, useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from './button';
import { messageFor } from './message-for';
import { Text } from './text';
import { useTheme } from './theme';
import { radius, space } from './tokens';

type Message = { id: number; text: string; tone: 'info' | 'danger'; action?: { label: string; onPress: () => void } };
type Show = (text: string, options?: { action?: Message['action'] }) => void;
type MessageApi = { show: Show; showError: (error: unknown) => void };

const MessageContext = createContext<MessageApi | null>(null);

/** One quiet message line at the bottom of the screen for outcomes that have no form to sit in. */
export function MessageProvider({ children }: { children: ReactNode }) {
  const [message, setMessage] = useState<Message | null>(null);
  const seq = useRef(0);
  const show: Show = useCallback(
    (text, options) => setMessage({ id: ++seq.current, text, tone: 'info', action: options?.action }),
    [],
  );
  const showError = useCallback(
    (error: unknown) => setMessage({ id: ++seq.current, text: messageFor(error), tone: 'danger' }),
    [],
  );
  const api = useMemo(() => ({ show, showError }), [show, showError]);

  useEffect(() => {
    if (!message) return;
    const timer = setTimeout(() => setMessage((m) => (m?.id === message.id ? null : m)), message.action ? 8000 : 5000);
    return () => clearTimeout(timer);
  }, [message]);

  return (
    <MessageContext.Provider value={api}>
      {children}
      {message ? <MessageLine message={message} onClose={() => setMessage(null)} /> : null}
    </MessageContext.Provider>
  );
}

function MessageLine({ message, onClose }: { message: Message; onClose: () => void }) {
  const t = useTheme();
  return (
    <View pointerEvents="box-none" style={styles.dock}>
      <View
        role={message.tone === 'danger' ? 'alert' : 'status'}
        aria-live="polite"
        testID="message-line"
        style={[
          styles.line,
          { backgroundColor: t.text, borderLeftColor: message.tone === 'danger' ? t.danger : t.cold },
        ]}
      >
        <Text style={[styles.text, { color: t.surface }]}>{message.text}</Text>
        {message.action ? (
          <Button
            label={message.action.label}
            variant="inverse"
            small
            testID="message-action"
            onPress={() => {
              message.action?.onPress();
              onClose();
            }}
          />
        ) : null}
        <Button
          label="Dismiss"
          accessibilityLabel="Dismiss message"
          variant="inverse"
          small
          testID="message-dismiss"
          onPress={onClose}
        />
      </View>
    </View>
  );
}

export function useMessage(): MessageApi {
  const api = useContext(MessageContext);
  if (!api) throw new Error('useMessage needs a MessageProvider above it.');
  return api;
}

const styles = StyleSheet.create({
  dock: { position: 'absolute', left: 0, right: 0, bottom: 80, alignItems: 'center', paddingHorizontal: space[2] },
  line: {
    maxWidth: 560,
    width: '100%',
    flexDirection: 'row',
    alignItems: 'center',
    gap: space[1],
    borderRadius: radius.control,
    borderLeftWidth: 4,
    paddingLeft: space[2],
    paddingRight: space[1],
    paddingVertical: space.half,
  },
  text: { flex: 1 },
});

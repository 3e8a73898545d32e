import { useRouter, type Href } from 'expo-router';
import { Pressable, type PressableProps } from 'react-native';

type ClickLike = {
  preventDefault?: () => void;
  metaKey?: boolean;
  ctrlKey?: boolean;
  shiftKey?: boolean;
  button?: number;
};

/**
 * A pressable that is a real link on the web (an <a href>, so middle-click and "open in
 * new tab" work) and navigates in-app on a plain press. Unlike `Link asChild`, it keeps
 * the pressable's state-driven styles.
 */
export function PressableLink({ href, onPress, ...rest }: Omit<PressableProps, 'role'> & { href: string }) {
  const router = useRouter();
  const webHref = { href } as object;
  return (
    <Pressable
      role="link"
      {...webHref}
      {...rest}
      onPress={(event) => {
        const e = (event?.nativeEvent ?? {}) as ClickLike;
        if (e.metaKey || e.ctrlKey || e.shiftKey || (e.button ?? 0) !== 0) return;
        (event as unknown as ClickLike)?.preventDefault?.();
        onPress?.(event);
        router.push(href as Href);
      }}
    />
  );
}

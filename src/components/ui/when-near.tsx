import { useEffect, useRef, useState, type ReactNode } from 'react';

export interface WhenNearProps {
  children: ReactNode;
  /** What holds the place until then: a loading line, or nothing. */
  placeholder?: ReactNode;
  /** How far below the screen the content starts to load, in CSS pixels. */
  margin?: number;
}

/**
 * Renders its content (and so loads a lazy card's code and data) once its place comes near the
 * screen, then keeps it. Below the fold on a slow phone's first visit, a card costs nothing until the
 * grower scrolls to it. Without IntersectionObserver the content renders at once.
 */
export function WhenNear({ children, placeholder = null, margin = 400 }: WhenNearProps) {
  const slot = useRef<HTMLDivElement>(null);
  const [near, setNear] = useState(() => typeof IntersectionObserver === 'undefined');
  useEffect(() => {
    const element = slot.current;
    if (near || !element) return;
    const observer = new IntersectionObserver(
      (entries) => {
        if (entries.some((e) => e.isIntersecting)) setNear(true);
      },
      { rootMargin: `${margin}px 0px` },
    );
    observer.observe(element);
    return () => observer.disconnect();
  }, [near, margin]);
  if (near) return <>{children}</>;
  return (
    <div ref={slot} data-when-near>
      {placeholder}
    </div>
  );
}

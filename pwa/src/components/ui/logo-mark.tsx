/** The Phasewright mark (public/logo-mark.svg, also the favicon and the icon source). */
export function LogoMark({ size = 32, className = '' }: { size?: number; className?: string }) {
  return <img src="/logo-mark.svg" width={size} height={size} alt="" aria-hidden="true" className={className} />;
}

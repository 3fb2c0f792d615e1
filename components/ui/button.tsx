import { forwardRef } from "react";
import { cn } from "./cn";

type Variant = "primary" | "secondary" | "ghost" | "danger";
type Size = "sm" | "md";

const variants: Record<Variant, string> = {
  primary: "bg-accent text-accent-fg hover:brightness-110 border border-transparent",
  secondary: "bg-raised text-fg border border-line hover:border-line-strong",
  ghost: "bg-transparent text-muted hover:text-fg hover:bg-raised border border-transparent",
  danger: "bg-alarm/15 text-alarm border border-alarm/40 hover:bg-alarm/25",
};
const sizes: Record<Size, string> = { sm: "h-8 px-2.5 text-sm gap-1.5", md: "h-10 px-4 text-sm gap-2" };

export interface ButtonProps extends React.ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: Variant;
  size?: Size;
}

export const Button = forwardRef<HTMLButtonElement, ButtonProps>(function Button(
  { variant = "secondary", size = "md", className, type = "button", ...props },
  ref,
) {
  return (
    <button
      ref={ref}
      type={type}
      className={cn(
        "inline-flex items-center justify-center rounded-md font-medium transition-colors disabled:cursor-not-allowed disabled:opacity-50",
        variants[variant],
        sizes[size],
        className,
      )}
      {...props}
    />
  );
});

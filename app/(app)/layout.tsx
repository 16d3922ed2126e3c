import { QueryProvider } from '@/components/query-provider';

export default function AppLayout({ children }: { children: React.ReactNode }) {
  return <QueryProvider>{children}</QueryProvider>;
}

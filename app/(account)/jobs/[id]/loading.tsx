import { Spinner } from '@/components/ui/Spinner';

export default function Loading() {
  return <Spinner label="Loading the job…" />;
}

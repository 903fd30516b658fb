import { QueryProvider } from '@/components/providers/QueryProvider';
import { Notice } from '@/components/ui/Notice';
import { PageHeading } from '@/components/ui/PageHeading';
import { FitPageClient } from './page-client';

export const metadata = { title: 'Fit check' };

export default function FitPage() {
  return (
    <>
      <PageHeading
        title="Fit check"
        lead="Describe one wheel and the frame it goes in. The verdict, spoke lengths and a baseline cost update as you type."
      />
      <div className="mb-6">
        <Notice tone="caution" title="Estimates, not a build sheet">
          Results come from a geometric model and typical part dimensions. A qualified wheel builder should confirm every figure with your actual
          parts. Changing frame spacing (cold-setting) or drilling hub flanges is work for a qualified frame or wheel builder, following local
          practice.
        </Notice>
      </div>
      <QueryProvider>
        <FitPageClient />
      </QueryProvider>
    </>
  );
}

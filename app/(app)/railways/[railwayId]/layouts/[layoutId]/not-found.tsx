import { ButtonLink } from '@/components/ui/button';
import { Card } from '@/components/ui/card';

export default function LayoutNotFound() {
  return (
    <Card title="Layout not found">
      <p className="mb-4 text-muted">This layout does not exist, or it belongs to a railway you are not a member of.</p>
      <ButtonLink href="/railways">Back to my railways</ButtonLink>
    </Card>
  );
}

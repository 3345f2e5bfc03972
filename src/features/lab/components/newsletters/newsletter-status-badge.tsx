import { Badge } from '@/components/badge';
import { type NewsletterStatus, newsletterStatusLabels, newsletterStatusTones } from '../../lib/newsletters';

export function NewsletterStatusBadge({ status }: { status: NewsletterStatus }) {
  return <Badge tone={newsletterStatusTones[status]}>{newsletterStatusLabels[status]}</Badge>;
}

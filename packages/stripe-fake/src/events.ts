import { resourceMissing } from './api-error.js';
import { route } from './api-route.js';
import { readExpand } from './expand.js';

export const eventRoutes = [
  route({
    method: 'GET',
    path: /^\/v1\/events\/([^/]+)$/,
    parse: (p) => readExpand(p, 'event'),
    run(fake, _expand, { ids }) {
      const event = fake.state.events.get(ids[0]!);
      if (!event) throw resourceMissing('event', ids[0]!, 'id');
      return fake.renderEvent(event);
    },
  }),
];

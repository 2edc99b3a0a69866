import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { REFRIGERANT_CODES } from '../../shared/domain';
import { RefrigerantOptions, SiteOptions } from '../../src/components/ui/filter-options';

describe('filter choices', () => {
  it('offers every site after an empty "All sites", by name or by code', () => {
    const sites = [
      { id: 4, name: 'North quay', code: 'NQ' },
      { id: 9, name: 'Greyhaven Depot', code: 'GH' },
    ];
    expect(renderToStaticMarkup(createElement(SiteOptions, { sites }))).toBe(
      '<option value="">All sites</option><option value="4">North quay</option><option value="9">Greyhaven Depot</option>',
    );
    expect(renderToStaticMarkup(createElement(SiteOptions, { sites, show: 'code' }))).toContain(
      '<option value="9">GH</option>',
    );
    expect(renderToStaticMarkup(createElement(SiteOptions, { sites: undefined }))).toBe(
      '<option value="">All sites</option>',
    );
  });

  it('offers every refrigerant after an empty "All refrigerants"', () => {
    const html = renderToStaticMarkup(createElement(RefrigerantOptions));
    expect(html.startsWith('<option value="">All refrigerants</option>')).toBe(true);
    expect(html.match(/<option/g)).toHaveLength(REFRIGERANT_CODES.length + 1);
  });
});

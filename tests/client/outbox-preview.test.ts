import { beforeEach, describe, expect, it } from 'vitest';
import { mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import type { CapturedMail } from '@shared/schemas/outbox';
import OutboxMailPreview from '@/components/OutboxMailPreview.vue';
import { linkSegments } from '@/components/outbox-presentation';

const mail: CapturedMail = {
  id: 7,
  to: 'orders@supplier.example.net',
  subject: 'Release R261202-FBS',
  text: 'Confirm here: http://localhost:3000/confirm/abc123.\nThank you.',
  html: '<p><a href="http://localhost:3000/confirm/abc123">Confirm release</a></p>',
  date: '2026-12-02T08:00:00.000Z',
  attachments: [{ fileName: 'forecast-FBS.csv', contentType: 'text/csv', sizeBytes: 2048 }],
};

describe('linkSegments', () => {
  it('makes each web address a link and leaves the full stop after it as text', () => {
    expect(linkSegments('Open https://a.example.com/x?y=1. Or http://b.example.org')).toEqual([
      { text: 'Open ', href: null },
      { text: 'https://a.example.com/x?y=1', href: 'https://a.example.com/x?y=1' },
      { text: '. Or ', href: null },
      { text: 'http://b.example.org', href: 'http://b.example.org' },
    ]);
  });

  it('gives text without addresses back as one run', () => {
    expect(linkSegments('No link here.')).toEqual([{ text: 'No link here.', href: null }]);
  });
});

describe('OutboxMailPreview', () => {
  beforeEach(() => setActivePinia(createPinia()));

  it('shows the HTML in a frame that cannot run scripts or navigate the app, its links opening a new tab', () => {
    const wrapper = mount(OutboxMailPreview, { props: { mail } });

    const frame = wrapper.get('iframe');
    expect(frame.attributes('sandbox')).toBe('allow-popups allow-popups-to-escape-sandbox');
    expect(frame.attributes('srcdoc')).toContain('<base target="_blank">');
    expect(frame.attributes('srcdoc')).toContain('Confirm release');
  });

  it('lists the attachments with their size', () => {
    const wrapper = mount(OutboxMailPreview, { props: { mail } });

    const files = wrapper.get('[aria-label="Attachments"]');
    expect(files.text()).toContain('forecast-FBS.csv');
    expect(files.text()).toContain('2 KB');
    expect(files.find('button[aria-label="Download forecast-FBS.csv"]').exists()).toBe(true);
  });

  it('shows the plain-text part with its address as a link to a new tab', async () => {
    const wrapper = mount(OutboxMailPreview, { props: { mail: { ...mail, html: '' } } });

    const link = wrapper.get('pre a');
    expect(link.attributes('href')).toBe('http://localhost:3000/confirm/abc123');
    expect(link.attributes('target')).toBe('_blank');
    expect(link.attributes('rel')).toBe('noopener noreferrer');
    expect(wrapper.get('pre').text()).toContain('Thank you.');
  });
});

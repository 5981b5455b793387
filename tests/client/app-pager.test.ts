import { createAppContext, demoUsers, mountInApp } from './helpers';
import { afterEach, describe, expect, it } from 'vitest';
import AppPager from '@/components/AppPager.vue';

async function mountPager(props: { total: number; pageSize?: number; pageSizes?: number[] }) {
  const context = await createAppContext({ user: demoUsers.buyer, path: '/' });
  return mountInApp(AppPager, context, { props: { page: 1, ...props } });
}

describe('AppPager', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
  });

  it('writes the total as every other count on screen, with a thousands separator', async () => {
    const wrapper = await mountPager({ total: 32000, pageSize: 50 });

    expect(wrapper.get('.app-pager__total').text()).toBe('Total 32,000');
    // 32,000 rows at 50 a page: 640 pages, the last one offered.
    expect(wrapper.get('.el-pager').text()).toContain('640');
  });

  it('stays away while one page holds every row, and offers page sizes when given', async () => {
    const single = await mountPager({ total: 50, pageSize: 50 });
    expect(single.find('.el-pagination').exists()).toBe(false);

    const sized = await mountPager({ total: 120, pageSize: 50, pageSizes: [50, 100, 200] });
    expect(sized.find('.el-pagination__sizes').exists()).toBe(true);
    await sized.get('.btn-next').trigger('click');
    expect(sized.emitted('update:page')).toEqual([[2]]);
  });
});

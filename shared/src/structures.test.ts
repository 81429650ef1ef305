import { bboxParameter } from './structures';

describe('bboxParameter', () => {
  it('reads west, south, east, north in that order', () => {
    expect(bboxParameter.parse('-99.5,37.25,-96,39')).toEqual({ minLon: -99.5, minLat: 37.25, maxLon: -96, maxLat: 39 });
  });

  it.each([
    ['', /four numbers/],
    ['1,2,3', /four numbers/],
    ['1,2,3,4,5', /four numbers/],
    ['1,,3,4', /four numbers/],
    ['a,2,3,4', /four numbers/],
    ['-181,0,10,10', /longitudes/],
    ['0,-91,10,10', /latitudes/],
    ['10,0,5,10', /minLon must be less than maxLon/],
    ['0,10,10,10', /minLat must be less than maxLat/],
  ])('refuses %p', (text, message) => {
    const result = bboxParameter.safeParse(text);
    expect(result.success).toBe(false);
    expect(result.error?.issues[0]?.message).toMatch(message);
  });
});

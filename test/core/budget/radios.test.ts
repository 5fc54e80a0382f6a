import { radios } from "../../../src/core/budget/index";
import { expectValueErrorNaming as expectValueError } from "../../_lib/expectError";

describe("RADIOS: ceil(total_share ÷ (max_utilization − overhead_share))", () => {
  it("needs 3 radios for 1.9 channels at the default 70 % ceiling", () => {
    // 1.9 ÷ 0.7 = 2.71 → 3
    expect(radios(1.9)).toBe(3);
  });

  it("needs 4 radios for 2.1 channels with 10 % beacon overhead", () => {
    // 2.1 ÷ (0.7 − 0.1) = 3.5 → 4
    expect(radios(2.1, 0.7, 0.1)).toBe(4);
  });

  it("does not add a radio for binary noise: 1.2 ÷ (0.7 − 0.1) is exactly 2", () => {
    expect(radios(1.2, 0.7, 0.1)).toBe(2);
  });

  it("needs no radio for no demand", () => {
    expect(radios(0)).toBe(0);
  });

  it("refuses a utilization of 1 or more", () => {
    expectValueError(() => radios(1, 1), "max_utilization");
  });

  it("refuses a utilization of 0", () => {
    expectValueError(() => radios(1, 0), "max_utilization");
  });

  it("refuses an overhead equal to the utilization", () => {
    expectValueError(() => radios(1, 0.5, 0.5), "overhead_share");
  });

  it("refuses an overhead above the utilization", () => {
    expectValueError(() => radios(1, 0.5, 0.6), "overhead_share");
  });

  it("refuses a negative total share", () => {
    expectValueError(() => radios(-0.1), "total_share");
  });
});

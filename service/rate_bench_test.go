package service_test

import (
	"context"
	"testing"

	"stagewright/service"
)

// benchMachine sizes a stage once and returns its machine and duty.
func benchMachine(b *testing.B, g service.GasInput, p1 float64) (service.StageResult, service.RateDuty) {
	b.Helper()
	d := service.StageDuty{Gas: g, SuctionPressure: p1, SuctionTemperature: 300, PressureRatio: f(1.6), MassFlow: f(6)}
	res, err := service.New().SizeStage(context.Background(), d)
	if err != nil {
		b.Fatal(err)
	}
	mdot := res.MassFlow * 0.9
	return res, service.RateDuty{Machine: res.Machine, Gas: g, SuctionPressure: p1, SuctionTemperature: 300, MassFlow: &mdot, Speed: f(res.Speed * 0.97)}
}

func benchRate(b *testing.B, g service.GasInput, p1 float64) {
	_, rd := benchMachine(b, g, p1)
	s := service.New()
	ctx := context.Background()
	b.ReportAllocs()
	for b.Loop() {
		if _, err := s.RateMachine(ctx, rd); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkRateConstantGas: one rating (with its surge and choke
// estimates) of a sized single-stage machine, constant-property air.
func BenchmarkRateConstantGas(b *testing.B) { benchRate(b, textbookAir(), 1e5) }

// BenchmarkRatePengRobinson: the same with a 5-component Peng-Robinson natural gas.
func BenchmarkRatePengRobinson(b *testing.B) { benchRate(b, natGas(), 30e5) }

// BenchmarkMapPengRobinson: a map of 5 speed lines × 25 points with the
// 5-component Peng-Robinson gas (issue 9 target: <= 20 ms on the
// development machine).
func BenchmarkMapPengRobinson(b *testing.B) {
	res, _ := benchMachine(b, natGas(), 30e5)
	s := service.New()
	ctx := context.Background()
	md := service.MapDuty{Machine: res.Machine, Gas: natGas(), SuctionPressure: 30e5, SuctionTemperature: 300, Points: 25}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := s.MapMachine(ctx, md); err != nil {
			b.Fatal(err)
		}
	}
}

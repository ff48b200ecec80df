package server

import (
	"context"
	"io"
	"log/slog"
	"testing"

	"google.golang.org/genproto/googleapis/rpc/errdetails"
	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/status"
	"google.golang.org/protobuf/proto"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

// smallFuzzService keeps every fuzz input cheap: short traces and padding,
// few layers, and through MaxSamples a cap on the mode solvers' arrays.
func smallFuzzService() *Service {
	lim := DefaultLimits()
	lim.MaxSamples = 1 << 12
	lim.MaxLayers = 6
	return &Service{limits: lim, log: slog.New(slog.NewTextHandler(io.Discard, nil))}
}

// checkChainOutcome is checkOutcome for the methods that run a mode: beside
// a finite response and INVALID_ARGUMENT with a field path, they may refuse
// too much work (RESOURCE_EXHAUSTED) or a diverging anharmonic solution
// (FAILED_PRECONDITION), each with a message. Never INTERNAL, UNKNOWN, any
// other code, or NaN/Inf in a response.
func checkChainOutcome(t *testing.T, resp proto.Message, err error) {
	t.Helper()
	if err == nil {
		if !allFinite(resp.ProtoReflect()) {
			t.Fatalf("response holds NaN or Inf: %v", resp)
		}
		return
	}
	st, _ := status.FromError(err)
	switch st.Code() {
	case codes.ResourceExhausted, codes.FailedPrecondition:
		if st.Message() == "" {
			t.Fatalf("%v without a message", st.Code())
		}
		return
	case codes.InvalidArgument:
		for _, d := range st.Details() {
			if br, ok := d.(*errdetails.BadRequest); ok && len(br.FieldViolations) > 0 && br.FieldViolations[0].Field != "" {
				return
			}
		}
		t.Fatalf("rejection without a field path: %v", err)
	}
	t.Fatalf("rejection with %v: %v", st.Code(), err)
}

func addSeeds(f *testing.F, seeds ...proto.Message) {
	for _, m := range seeds {
		b, err := proto.Marshal(m)
		if err != nil {
			f.Fatal(err)
		}
		f.Add(b)
	}
}

// fuzzWave is a short model pulse (800 samples) for the seeds.
func fuzzWave() *thzdrivev1.Waveform {
	return modelWave(thzdrivev1.PulseShape_PULSE_SHAPE_SINGLE_CYCLE, 2, 300, 10, 8)
}

// FuzzPropagateWire feeds arbitrary wire bytes to Propagate.
func FuzzPropagateWire(f *testing.F) {
	one := int32(1)
	addSeeds(f,
		&thzdrivev1.PropagateRequest{Waveform: fuzzWave(),
			Train:  []*thzdrivev1.TrainElement{slabElement(materialMedium("silicon-hr"), 1000, true)},
			Sample: &thzdrivev1.SampleStack{}},
		&thzdrivev1.PropagateRequest{Waveform: fuzzWave(),
			Sample: &thzdrivev1.SampleStack{IncidenceAngleDeg: 30, Polarization: thzdrivev1.Polarization_POLARIZATION_P,
				Layers: []*thzdrivev1.Layer{{Medium: constantMedium(2, 0.1), ThicknessUm: 3}, {Medium: lorentzMedium(10.89,
					&thzdrivev1.LorentzOscillator{FrequencyThz: 8.2, LinewidthThz: 0.1, DeltaEps: 2}), ThicknessUm: 0.5}},
				ExitMedium: materialMedium("sapphire-o")},
			Target: &thzdrivev1.Target{Layer: &one, Placement: thzdrivev1.TargetPlacement_TARGET_PLACEMENT_LAYER_AVERAGE}},
		&thzdrivev1.PropagateRequest{Waveform: traceWave(kvTrace(-2, 20, 256, func(t float64) float64 { return 50 * t * t * t })),
			Train: []*thzdrivev1.TrainElement{{Kind: &thzdrivev1.TrainElement_Attenuator{Attenuator: &thzdrivev1.WireGridAttenuator{AngleDeg: 30}}},
				{Kind: &thzdrivev1.TrainElement_FieldFactor{FieldFactor: &thzdrivev1.FieldFactor{Amplitude: 2, PhaseRad: 1}}}},
			Sample: &thzdrivev1.SampleStack{ExitMedium: &thzdrivev1.Medium{Kind: &thzdrivev1.Medium_Tabulated{Tabulated: &thzdrivev1.TabulatedIndex{
				FrequencyThz: []float64{0.5, 1, 2}, N: []float64{3, 3.1, 3.3}, Kappa: []float64{0, 0.01, 0.05}}}}},
			PadToSamples: 1024},
	)
	svc := smallFuzzService()
	f.Fuzz(func(t *testing.T, data []byte) {
		req := &thzdrivev1.PropagateRequest{}
		if proto.Unmarshal(data, req) != nil {
			return
		}
		resp, err := svc.Propagate(context.Background(), req)
		checkOutcome(t, resp, err)
	})
}

// FuzzDriveModeWire feeds arbitrary wire bytes to DriveMode.
func FuzzDriveModeWire(f *testing.F) {
	j := int32(0)
	addSeeds(f,
		&thzdrivev1.DriveModeRequest{Waveform: fuzzWave(), Mode: gaasModeByCharge()},
		&thzdrivev1.DriveModeRequest{Waveform: fuzzWave(), Sample: &thzdrivev1.SampleStack{
			ExitMedium: lorentzMedium(8, &thzdrivev1.LorentzOscillator{FrequencyThz: 2, LinewidthThz: 0.15, DeltaEps: 2})},
			Mode: &thzdrivev1.PhononMode{TargetOscillator: &j, CellVolumeA3: 150, EffectiveMassAmu: 30, BondLengthA: 2.5}, ProbeDepthNm: 100},
		&thzdrivev1.DriveModeRequest{Waveform: fuzzWave(), Method: thzdrivev1.DriveMethod_DRIVE_METHOD_TIME_DOMAIN,
			Mode: &thzdrivev1.PhononMode{FrequencyThz: 1.5, LinewidthThz: 0.1, CellVolumeA3: 100,
				Strength:                      &thzdrivev1.PhononMode_DeltaEps{DeltaEps: 1},
				AnharmonicA3PerPs2PerASqrtAmu: 5, AnharmonicA4PerPs2PerA2Amu: 50, RamanDepsDqPerASqrtAmu: 0.5, PolarizationAngleDeg: 20}},
	)
	svc := smallFuzzService()
	f.Fuzz(func(t *testing.T, data []byte) {
		req := &thzdrivev1.DriveModeRequest{}
		if proto.Unmarshal(data, req) != nil {
			return
		}
		resp, err := svc.DriveMode(context.Background(), req)
		checkChainOutcome(t, resp, err)
	})
}

// FuzzSizeFieldWire feeds arbitrary wire bytes to SizeField.
func FuzzSizeFieldWire(f *testing.F) {
	short := func(a4 float64) *thzdrivev1.DriveModeRequest {
		r := sizingChain(a4)
		r.Waveform = modelWave(thzdrivev1.PulseShape_PULSE_SHAPE_CENTRAL_LOBE, 1.5, 100, 20, 8)
		return r
	}
	addSeeds(f,
		&thzdrivev1.SizeFieldRequest{Drive: short(0), SpotX: radiusSpot(400),
			Target: &thzdrivev1.SizeFieldRequest_MaxQASqrtAmu{MaxQASqrtAmu: 0.05}, SourceLimitUj: 1},
		&thzdrivev1.SizeFieldRequest{Drive: short(100), SpotX: radiusSpot(400), SpotY: &thzdrivev1.SpotSize{Size: &thzdrivev1.SpotSize_FwhmUm{FwhmUm: 300}},
			Target: &thzdrivev1.SizeFieldRequest_DisplacementPm{DisplacementPm: 1}, MaxPeakFieldKvPerCm: 5000},
		&thzdrivev1.SizeFieldRequest{Drive: &thzdrivev1.DriveModeRequest{Waveform: traceWave(uniformTrace(128, 20)), Mode: gaasModeByCharge()},
			SpotX:  &thzdrivev1.SpotSize{Size: &thzdrivev1.SpotSize_KnifeEdge_10_90Um{KnifeEdge_10_90Um: 200}},
			Target: &thzdrivev1.SizeFieldRequest_Quanta{Quanta: 2}},
	)
	svc := smallFuzzService()
	f.Fuzz(func(t *testing.T, data []byte) {
		req := &thzdrivev1.SizeFieldRequest{}
		if proto.Unmarshal(data, req) != nil {
			return
		}
		resp, err := svc.SizeField(context.Background(), req)
		checkChainOutcome(t, resp, err)
	})
}

// FuzzEstimateHeatingWire feeds arbitrary wire bytes to EstimateHeating.
func FuzzEstimateHeatingWire(f *testing.F) {
	addSeeds(f,
		&thzdrivev1.EstimateHeatingRequest{IncidentFluenceUjPerCm2: 1000, AbsorbedFraction: 0.5,
			Geometry: thzdrivev1.SampleGeometry_SAMPLE_GEOMETRY_FILM, ThicknessUm: 0.1,
			HeatCapacity: constantCapacity(2), BaseTemperatureK: 10, TransitionTemperatureK: 30},
		&thzdrivev1.EstimateHeatingRequest{PulseEnergyUj: 4.5, AbsorbedFraction: 0.1, RepetitionRateKhz: 1000, SpotRadiusUm: 141,
			ThermalConductivityWPerMK: 27, Geometry: thzdrivev1.SampleGeometry_SAMPLE_GEOMETRY_BULK, AbsorptionDepthUm: 2,
			HeatCapacity:     &thzdrivev1.HeatCapacityModel{Kind: &thzdrivev1.HeatCapacityModel_Debye{Debye: &thzdrivev1.DebyeModel{DebyeTemperatureK: 345, AtomsPerNm3: 44.2}}},
			BaseTemperatureK: 80, TransitionTemperatureK: 150, ZNu: 1.28, DamageClass: thzdrivev1.DamageClass_DAMAGE_CLASS_DIELECTRIC},
		&thzdrivev1.EstimateHeatingRequest{AbsorbedFluenceUjPerCm2: 300, Geometry: thzdrivev1.SampleGeometry_SAMPLE_GEOMETRY_BULK,
			AbsorptionCoefficientPerCm: 1e4, BaseTemperatureK: 20,
			HeatCapacity: &thzdrivev1.HeatCapacityModel{Kind: &thzdrivev1.HeatCapacityModel_Table{Table: &thzdrivev1.HeatCapacityTable{
				TemperatureK: []float64{5, 50, 300}, CapacityJPerCm3K: []float64{0.01, 0.5, 1.7}}}}, DamageThresholdMjPerCm2: 50},
	)
	svc := smallFuzzService()
	f.Fuzz(func(t *testing.T, data []byte) {
		req := &thzdrivev1.EstimateHeatingRequest{}
		if proto.Unmarshal(data, req) != nil {
			return
		}
		resp, err := svc.EstimateHeating(context.Background(), req)
		checkOutcome(t, resp, err)
	})
}

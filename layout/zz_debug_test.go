package layout
import ("testing";"fmt")
func TestDebugHeights(t *testing.T){
 f,_:=NewFonts()
 d:=debugData()
 for _,pn:=range []string{"a5","half-letter","5x8"}{
 p,_:=PageByName(pn)
 b:=&builder{f:f,card:&Card{Page:p}}
 w:=p.WidthMM-2*marginMM
 h:=b.header(d,marginMM,marginMM,w); ft:=b.footer(d,marginMM,w,p.HeightMM-marginMM); lg:=b.legend(d,marginMM,w); fp,_:=b.figureSize(d,w); tl:=b.tools(d,marginMM,w,fp)
 room:=ft.Box.Y-gapMM-lg.Box.H-gapMM-tl.Box.H-gapMM-(h.Box.Y+h.Box.H+gapMM)
 g,_:=b.columns(d,w)
 fmt.Printf("%s header %.1f footer %.1f legend %.1f tools %.1f room %.1f cols %+v\n",pn,h.Box.H,ft.Box.H,lg.Box.H,tl.Box.H,room,g)
 }
}
func dump(b Block){ for _,t:=range b.Texts{ fmt.Printf("  %5.1f %4.1fpt %q\n", t.Box.Y, t.SizePt, t.S)} }
func TestDebugDump(t *testing.T){
 f,_:=NewFonts()
 p,_:=PageByName("a5")
 b:=&builder{f:f,card:&Card{Page:p}}
 d:=debugData()
 w:=p.WidthMM-2*marginMM
 dump(b.header(d,marginMM,marginMM,w)); dump(b.tools(d,marginMM,w,10))
}

func debugData() CardData { return CardData{AirfieldName:"Saltpan Mesa Strip (demo)",Ident:"KP-SPM",Designator:"04",HeadingDeg:40,Surface:"gravel",Condition:"dry",ConditionPages:2,SlopePct:1.1,
 Declared:[]DeclaredDistance{{"TORA",1100},{"TODA",1100},{"ASDA",1100}},Limiting:"TORA",RunwayNotes:"Rising ground beyond the end of 04. Density altitude often above 8000 ft in summer.",
 AircraftName:"Sedgefin SF-2 demo trainer",Flap:"10°",ModelName:"flight-manual table",PolicyTitle:"UK CAA advisory factors",PolicyItems:[]string{"unpaved, dry: grass factor +20 % (firm surface: AMC1 CAT.POL.A.305)","upslope 1.1 % +5.5 %","TOD ×1.33 ≤ TORA"},
 QNHhPa:1000,QNHinHg:29.53,PressureAltFt:5301,HotterPer10hPa:4,Unit:"m",MassUnit:"kg",TempUnit:"C",Temps:[]float64{0,5,10,15,20,25,30,35},DensityAltFt:[]float64{4000,4600,5200,5800,6400,7000,7600,8200},
 WindsKt:[]float64{-10,-5,0,5,10,15,20},TightMarginPct:10,Accel:AccelCheck{MidpointDist:550,RotateKIAS:55,SpeedKIAS:39,Expected:[]ExpectedPoint{{1000,true,30,300},{900,true,35,250},{800,true,35,200}}},
 Crosswind:CrosswindHelper{SpeedsKt:[]float64{10,15,20,25},AnglesDeg:[]float64{15,30,45,60,90},Kt:[][]float64{{3,5,8,9,10},{4,8,11,13,15},{6,10,15,18,20},{7,13,18,22,25}},DemonstratedKt:15},
 Generated:"2026-12-01",ValidUntil:"2027-03-31",Fingerprint:"a5cc4f90b71a",Version:"sample",Caution:"CAUTION: planning figures, not a substitute for the approved flight manual: verify against it. The pilot in command decides. Figures assume the profile's aircraft, engine and technique; a worn aircraft, soft or contaminated ground or a rushed takeoff needs more. Local regulations and licensed practice take precedence."} }
